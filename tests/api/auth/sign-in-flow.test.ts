import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS } from '../../../ops/oidc-provider/demo-accounts';
import { CookieJar, jsonOf, signInThroughProvider, startSignInWorld, step, type SignInWorld } from './sign-in-harness';

describe('sign-in through the local OpenID Connect provider (code + PKCE)', () => {
  let world: SignInWorld;
  beforeAll(async () => {
    world = await startSignInWorld();
  });
  afterAll(async () => {
    await world.close();
  });

  it('when sign-in starts, then the provider is asked for a code with an S256 PKCE challenge, a state and a nonce', async () => {
    const res = await step(new CookieJar(), `${world.appUrl}/api/auth/login`);
    expect(res.status).toBe(303);
    const to = new URL(res.headers.get('location')!);
    expect(to.origin).toBe(world.issuer);
    expect(to.searchParams.get('response_type')).toBe('code');
    expect(to.searchParams.get('code_challenge_method')).toBe('S256');
    expect(to.searchParams.get('code_challenge')).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(to.searchParams.get('state')).toBeTruthy();
    expect(to.searchParams.get('nonce')).toBeTruthy();
    expect(to.searchParams.get('redirect_uri')).toBe(`${world.appUrl}/api/auth/callback`);
  });

  it('when the owner signs in with the demo password, then a user row is made from the ID token and /me answers', async () => {
    const owner = DEMO_ACCOUNTS.find((a) => a.login === 'owner')!;
    const { jar, finalLocation } = await signInThroughProvider(world, 'owner');
    expect(finalLocation).toBe('/fleet');
    const me = await step(jar, `${world.appUrl}/api/auth/me`);
    expect(me.status).toBe(200);
    expect((await jsonOf(me)).user).toMatchObject({ login: 'owner', name: owner.name, email: owner.email, role: 'owner', teams: [] });
    const row = await world.tdb.db('users').where({ login: 'owner' }).first();
    expect(row).toMatchObject({ subject: owner.subject, role: 'owner' });
    expect(await world.tdb.db('audit_log').where({ action: 'user.signed_in', subject_id: String(row.id) }).count('id as n').first()).toEqual({ n: 1 });
  });

  it('when sign-in completes, then the session id is a fresh one, not the one from before sign-in', async () => {
    const jar = new CookieJar();
    await step(jar, `${world.appUrl}/api/auth/login`);
    const before = jar.get('brimwatch.sid');
    const { jar: after } = await signInThroughProvider(world, 'viewer');
    expect(before).toBeTruthy();
    expect(after.get('brimwatch.sid')).toBeTruthy();
    expect(after.get('brimwatch.sid')).not.toBe(before);
  });

  it('when an admin later changes the role, then signing in again keeps the role set in Brimwatch', async () => {
    await signInThroughProvider(world, 'responder');
    await world.tdb.db('users').where({ login: 'responder' }).update({ role: 'viewer' });
    const { jar } = await signInThroughProvider(world, 'responder');
    expect((await jsonOf(await step(jar, `${world.appUrl}/api/auth/me`))).user.role).toBe('viewer');
  });

  it('when the password is wrong, then the provider refuses with a message and no user is made', async () => {
    const { passwordAnswer } = await signInThroughProvider(world, 'sre', 'wrong');
    expect(passwordAnswer.status).toBe(401);
    expect(await passwordAnswer.text()).toMatch(/Wrong login or password/);
    expect(await world.tdb.db('users').where({ login: 'sre' }).first()).toBeUndefined();
  });

  it('when the callback comes without the session that began sign-in, then it is sent back to the sign-in page with a reason', async () => {
    const res = await step(new CookieJar(), `${world.appUrl}/api/auth/callback?code=abc&state=xyz`);
    expect(res.status).toBe(303);
    expect(decodeURIComponent(res.headers.get('location')!)).toMatch(/^\/sign-in\?problem=This sign-in attempt has expired/);
  });

  it('when the state does not match, then the code is not accepted', async () => {
    const jar = new CookieJar();
    await step(jar, `${world.appUrl}/api/auth/login`);
    const res = await step(jar, `${world.appUrl}/api/auth/callback?code=abc&state=forged&iss=${encodeURIComponent(world.issuer)}`);
    expect(res.status).toBe(303);
    expect(decodeURIComponent(res.headers.get('location')!)).toMatch(/^\/sign-in\?problem=Sign-in failed .*state/);
    expect((await step(jar, `${world.appUrl}/api/auth/me`)).status).toBe(401);
  });

  it('when the user signs out, then the session ends on the server and the cookie no longer works', async () => {
    const { jar } = await signInThroughProvider(world, 'admin');
    const cookie = jar.header();
    const out = await step(jar, `${world.appUrl}/api/auth/logout`, { method: 'POST' });
    expect(out.status).toBe(204);
    const replay = await fetch(`${world.appUrl}/api/auth/me`, { headers: { cookie } });
    expect(replay.status).toBe(401);
  });

  it('when the session cookie is set, then it is HttpOnly and SameSite=Lax', async () => {
    const res = await step(new CookieJar(), `${world.appUrl}/api/auth/login`);
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith('brimwatch.sid='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // served over plain http on loopback
  });
});
