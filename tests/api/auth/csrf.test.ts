import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { jsonOf, signInThroughProvider, startSignInWorld, step, type CookieJar, type SignInWorld } from './sign-in-harness';

describe('requests from another site', () => {
  let world: SignInWorld;
  let admin: CookieJar;
  beforeAll(async () => {
    world = await startSignInWorld();
    admin = (await signInThroughProvider(world, 'admin')).jar;
  });
  afterAll(async () => {
    await world.close();
  });

  const createTeam = (slug: string, headers: Record<string, string>) =>
    step(admin, `${world.appUrl}/api/v1/teams`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', ...headers },
      body: JSON.stringify({ slug, name: slug }),
    });
  const teamExists = async (slug: string) => (await world.tdb.db('teams').where({ slug }).first()) !== undefined;

  it('when a signed-in admin\'s browser posts from another site, then it is refused and nothing is stored', async () => {
    const res = await createTeam('forged', { 'sec-fetch-site': 'cross-site', origin: 'http://shop.example.test' });
    expect(res.status).toBe(403);
    expect((await jsonOf(res)).error).toMatchObject({ code: 'cross_site' });
    expect(await teamExists('forged')).toBe(false);
  });

  it('when the post comes from another port of the same host (same-site), then it is refused too', async () => {
    const res = await createTeam('sibling', { 'sec-fetch-site': 'same-site' });
    expect(res.status).toBe(403);
    expect(await teamExists('sibling')).toBe(false);
  });

  it('when a browser posts from Brimwatch\'s own pages, then it passes', async () => {
    const res = await createTeam('own-page', { 'sec-fetch-site': 'same-origin', origin: world.appUrl });
    expect(res.status).toBe(201);
    expect(await teamExists('own-page')).toBe(true);
  });

  it('when an older browser sends only Origin, then a foreign origin is refused and our own passes', async () => {
    expect((await createTeam('old-foreign', { origin: 'http://127.0.0.1:1' })).status).toBe(403);
    expect(await teamExists('old-foreign')).toBe(false);
    expect((await createTeam('old-own', { origin: world.appUrl })).status).toBe(201);
  });

  it('when a cross-site request carries a bearer token, then the site check does not apply (there is no cookie to ride on)', async () => {
    const made = await step(admin, `${world.appUrl}/api/v1/tokens`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ label: 'pipeline' }) });
    const { secret } = await jsonOf(made);
    const res = await fetch(`${world.appUrl}/api/v1/teams`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', authorization: `Bearer ${secret}`, 'sec-fetch-site': 'cross-site' },
      body: JSON.stringify({ slug: 'by-token', name: 'By token' }),
    });
    expect(res.status).toBe(201);
  });

  it('when sign-out is asked for with GET, then nothing happens: changes never ride on GET', async () => {
    const res = await step(admin, `${world.appUrl}/api/auth/logout`);
    expect(res.status).toBe(404);
    expect((await step(admin, `${world.appUrl}/api/auth/me`)).status).toBe(200);
  });
});
