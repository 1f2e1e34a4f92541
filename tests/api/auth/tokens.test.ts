import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jsonOf, signInThroughProvider, startSignInWorld, step, type CookieJar, type SignInWorld } from './sign-in-harness';

describe('API tokens', () => {
  let world: SignInWorld;
  let sre: CookieJar;
  let admin: CookieJar;
  let viewer: CookieJar;
  beforeAll(async () => {
    world = await startSignInWorld();
    sre = (await signInThroughProvider(world, 'sre')).jar;
    admin = (await signInThroughProvider(world, 'admin')).jar;
    viewer = (await signInThroughProvider(world, 'viewer')).jar;
  });
  afterAll(async () => {
    await world.close();
  });

  const make = (jar: CookieJar, body: unknown) =>
    step(jar, `${world.appUrl}/api/v1/tokens`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  const asBearer = (authorization: string, path = '/api/auth/me') => fetch(`${world.appUrl}${path}`, { headers: { authorization } });
  const tokenCount = async () => Number((await world.tdb.db('api_tokens').count('id as n').first())!.n);

  it('when a token is made, then its secret is shown once, only its SHA-256 is stored, and lists never show it', async () => {
    const res = await make(sre, { label: 'deploy pipeline', expiresInDays: 30 });
    expect(res.status).toBe(201);
    const { secret, token } = await jsonOf(res);
    expect(secret).toMatch(/^bwt_[A-Za-z0-9_-]{43}$/);
    expect(token).toMatchObject({ label: 'deploy pipeline', role: 'sre', userLogin: 'sre', revokedAt: null });

    const row = await world.tdb.db('api_tokens').where({ id: token.id }).first();
    expect(row.token_hash).toBe(createHash('sha256').update(secret).digest('hex'));
    expect(JSON.stringify(row)).not.toContain(secret);
    const listed = await step(sre, `${world.appUrl}/api/v1/tokens`);
    expect(JSON.stringify(await jsonOf(listed))).not.toContain(secret);

    const me = await asBearer(`Bearer ${secret}`);
    expect(me.status).toBe(200);
    expect((await jsonOf(me)).user).toMatchObject({ login: 'sre', role: 'sre', via: 'token' });
  });

  it('when a token is revoked, then it is refused with 401 saying so', async () => {
    const { secret, token } = await jsonOf(await make(sre, { label: 'to revoke' }));
    const revoked = await step(sre, `${world.appUrl}/api/v1/tokens/${token.id}`, { method: 'DELETE' });
    expect(revoked.status).toBe(200);
    expect((await jsonOf(revoked)).token.revokedAt).not.toBeNull();
    const res = await asBearer(`Bearer ${secret}`);
    expect(res.status).toBe(401);
    expect((await jsonOf(res)).error).toMatchObject({ code: 'token_revoked' });
    expect(await world.tdb.db('audit_log').where({ action: 'token.revoked', subject_id: String(token.id) }).first()).toMatchObject({ actor: 'sre' });
  });

  it('when a token has expired, then it is refused with 401 saying when', async () => {
    const { secret, token } = await jsonOf(await make(sre, { label: 'short lived', expiresInDays: 1 }));
    await world.tdb.db('api_tokens').where({ id: token.id }).update({ expires_at: new Date(Date.now() - 1000) });
    const res = await asBearer(`Bearer ${secret}`);
    expect(res.status).toBe(401);
    expect((await jsonOf(res)).error.message).toMatch(/expired on \d{4}-/);
  });

  it.each([
    ['Bearer', 'no token'],
    ['Basic c3JlOmRlbW8=', 'another scheme'],
    ['Bearer bwt_short', 'a truncated token'],
    ['Bearer  two words', 'spaces'],
  ])('when the Authorization header is %j (%s), then it answers 401 saying how to send a token', async (header) => {
    const res = await asBearer(header);
    expect(res.status).toBe(401);
    expect((await jsonOf(res)).error).toMatchObject({ code: 'bad_authorization' });
    expect((await jsonOf(await asBearer(header))).error.message).toMatch(/Bearer <token>/);
  });

  it('when a well-formed token is unknown, then it answers 401 unknown_token', async () => {
    const res = await asBearer(`Bearer bwt_${'A'.repeat(43)}`);
    expect(res.status).toBe(401);
    expect((await jsonOf(res)).error.code).toBe('unknown_token');
  });

  it('when the label is empty, then it answers 400 naming the field and stores nothing', async () => {
    const before = await tokenCount();
    const res = await make(sre, { label: '   ' });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ field: 'label', message: expect.stringMatching(/label must not be empty/) });
    expect(await tokenCount()).toBe(before);
  });

  it('when a token asks for more than its maker\'s role, or an unknown role, then it is refused and nothing is stored', async () => {
    const before = await tokenCount();
    const higher = await make(viewer, { label: 'sneaky', role: 'admin' });
    expect(higher.status).toBe(403);
    expect((await jsonOf(higher)).error).toMatchObject({ code: 'role_too_high', field: 'role' });
    const unknown = await make(viewer, { label: 'odd', role: 'superuser' });
    expect(unknown.status).toBe(400);
    expect((await jsonOf(unknown)).error.message).toMatch(/role must be one of viewer, responder, owner, sre, admin/);
    expect(await tokenCount()).toBe(before);
  });

  it('when a token\'s maker is demoted, then the token carries only the lower role', async () => {
    const { secret } = await jsonOf(await make(sre, { label: 'before demotion' }));
    const sreId = (await world.tdb.db('users').where({ login: 'sre' }).first('id')).id;
    const patch = await step(admin, `${world.appUrl}/api/v1/users/${sreId}`, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ role: 'responder' }) });
    expect(patch.status).toBe(200);
    expect((await jsonOf(await asBearer(`Bearer ${secret}`))).user.role).toBe('responder');
  });

  it('when someone else\'s token is revoked, then only an admin may; everyone\'s list is for admins only', async () => {
    const { token } = await jsonOf(await make(viewer, { label: 'viewer script' }));
    expect((await step(sre, `${world.appUrl}/api/v1/tokens/${token.id}`, { method: 'DELETE' })).status).toBe(403);
    expect((await step(sre, `${world.appUrl}/api/v1/tokens?scope=all`)).status).toBe(403);
    const all = await jsonOf(await step(admin, `${world.appUrl}/api/v1/tokens?scope=all`));
    expect(all.tokens.map((t: { userLogin: string }) => t.userLogin)).toEqual(expect.arrayContaining(['sre', 'viewer']));
    expect((await step(admin, `${world.appUrl}/api/v1/tokens/${token.id}`, { method: 'DELETE' })).status).toBe(200);
  });

  it('when a token tries to make another token, then it is refused: new tokens are made in the browser', async () => {
    const { secret } = await jsonOf(await make(admin, { label: 'admin automation' }));
    const res = await fetch(`${world.appUrl}/api/v1/tokens`, { method: 'POST', headers: { authorization: `Bearer ${secret}`, 'content-type': 'application/json' }, body: JSON.stringify({ label: 'child' }) });
    expect(res.status).toBe(403);
    expect((await jsonOf(res)).error.code).toBe('session_only');
  });
});
