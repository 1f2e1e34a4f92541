import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jsonOf, signInThroughProvider, startSignInWorld, step, type CookieJar, type SignInWorld } from './sign-in-harness';

describe('users, teams and the audit log', () => {
  let world: SignInWorld;
  let admin: CookieJar;
  let owner: CookieJar;
  let ids: Record<string, number>;
  beforeAll(async () => {
    world = await startSignInWorld();
    admin = (await signInThroughProvider(world, 'admin')).jar;
    owner = (await signInThroughProvider(world, 'owner')).jar;
    ids = Object.fromEntries((await world.tdb.db('users').select('id', 'login')).map((u) => [u.login, Number(u.id)]));
  });
  afterAll(async () => {
    await world.close();
  });

  const send = (jar: CookieJar, method: string, path: string, body?: unknown) =>
    step(jar, world.appUrl + path, { method, headers: body === undefined ? {} : { 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });

  it('when an admin makes a team, adds the owner and the owner sets its addresses, then every step is audited with before and after', async () => {
    const made = await send(admin, 'POST', '/api/v1/teams', { slug: 'payments', name: 'Payments', alertEmail: 'payments-alerts@larkfield.test' });
    expect(made.status).toBe(201);
    const team = (await jsonOf(made)).team;
    expect((await send(admin, 'PUT', `/api/v1/teams/${team.id}/members/${ids.owner}`, { wantsAlertMail: true })).status).toBe(200);

    const changed = await send(owner, 'PATCH', `/api/v1/teams/${team.id}`, { escalationEmail: 'payments-oncall@larkfield.test' });
    expect(changed.status).toBe(200);
    expect((await jsonOf(changed)).team).toMatchObject({ alertEmail: 'payments-alerts@larkfield.test', escalationEmail: 'payments-oncall@larkfield.test' });

    const listed = (await jsonOf(await send(owner, 'GET', '/api/v1/teams'))).teams;
    expect(listed).toEqual([expect.objectContaining({ slug: 'payments', members: [expect.objectContaining({ login: 'owner', wantsAlertMail: true })] })]);

    const audit = (await jsonOf(await send(admin, 'GET', `/api/v1/audit?subjectType=team&subjectId=${team.id}`))).entries;
    expect(audit.map((e: { action: string }) => e.action)).toEqual(['team.updated', 'team.member_added', 'team.created']);
    expect(audit[0]).toMatchObject({ actor: 'owner', before: { escalationEmail: null }, after: { escalationEmail: 'payments-oncall@larkfield.test' } });
  });

  it('when an owner tries to rename their team, then only the addresses are theirs to change', async () => {
    const team = await world.tdb.db('teams').where({ slug: 'payments' }).first();
    const res = await send(owner, 'PATCH', `/api/v1/teams/${team.id}`, { name: 'Money' });
    expect(res.status).toBe(403);
    expect((await world.tdb.db('teams').where({ id: team.id }).first()).name).toBe('Payments');
  });

  it('when an address is not an e-mail address, then it answers 400 naming the field', async () => {
    const team = await world.tdb.db('teams').where({ slug: 'payments' }).first();
    const res = await send(owner, 'PATCH', `/api/v1/teams/${team.id}`, { alertEmail: 'payments at larkfield' });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ field: 'alertEmail' });
  });

  it('when an admin sets an unknown role, then it answers 400 listing the roles and changes nothing', async () => {
    const auditBefore = await world.tdb.db('audit_log').count('id as n').first();
    const res = await send(admin, 'PATCH', `/api/v1/users/${ids.owner}`, { role: 'overlord' });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ field: 'role', message: 'role must be one of viewer, responder, owner, sre, admin' });
    expect((await world.tdb.db('users').where({ id: ids.owner }).first()).role).toBe('owner');
    expect(await world.tdb.db('audit_log').count('id as n').first()).toEqual(auditBefore);
  });

  it('when the only admin would be demoted, then it is refused so that someone can still manage roles', async () => {
    const res = await send(admin, 'PATCH', `/api/v1/users/${ids.admin}`, { role: 'viewer' });
    expect(res.status).toBe(409);
    expect((await jsonOf(res)).error.code).toBe('last_admin');
  });

  it('when an admin changes a role, then the user list shows it and the audit log can be filtered by actor, action and time', async () => {
    const since = new Date(Date.now() - 1000).toISOString();
    expect((await send(admin, 'PATCH', `/api/v1/users/${ids.owner}`, { role: 'responder' })).status).toBe(200);
    const users = (await jsonOf(await send(admin, 'GET', '/api/v1/users'))).users;
    expect(users.find((u: { login: string }) => u.login === 'owner')).toMatchObject({ role: 'responder', teams: [expect.objectContaining({ slug: 'payments' })] });

    const page = await jsonOf(await send(admin, 'GET', `/api/v1/audit?actor=admin&action=user.role_changed&from=${encodeURIComponent(since)}`));
    expect(page).toMatchObject({ total: 1, page: 1, entries: [{ action: 'user.role_changed', before: { role: 'owner' }, after: { role: 'responder' } }] });
    const prefix = await jsonOf(await send(admin, 'GET', '/api/v1/audit?action=team.'));
    expect(prefix.entries.every((e: { action: string }) => e.action.startsWith('team.'))).toBe(true);
    expect(prefix.total).toBe(3);
  });

  it('when the audit log is paged, then pages do not overlap and the total stays the same', async () => {
    const first = await jsonOf(await send(admin, 'GET', '/api/v1/audit?pageSize=2&page=1'));
    const second = await jsonOf(await send(admin, 'GET', '/api/v1/audit?pageSize=2&page=2'));
    expect(first.entries).toHaveLength(2);
    expect(second.total).toBe(first.total);
    expect(second.entries.map((e: { id: number }) => e.id)).not.toContain(first.entries[0].id);
  });

  it('when an audit filter is malformed, then it answers 400 naming the parameter', async () => {
    const res = await send(admin, 'GET', '/api/v1/audit?from=yesterday');
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ field: 'from' });
    expect((await send(admin, 'GET', '/api/v1/audit?pageSize=5000')).status).toBe(400);
  });
});
