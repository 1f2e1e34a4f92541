import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runSeeds } from '../../ops/run/database';
import { DEMO_ACCOUNTS } from '../../ops/oidc-provider/demo-accounts';
import { createTestDatabase, type TestDatabase } from '../setup/database';

describe('the demo seed and the demo accounts', () => {
  let tdb: TestDatabase;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    await runSeeds(tdb.db, path.resolve('seeds'));
  });
  afterAll(async () => {
    await tdb.drop();
  });

  it('when the demo is seeded, then every demo account exists once with its role, and the owner is in exactly one team', async () => {
    const users = await tdb.db('users').whereIn('login', DEMO_ACCOUNTS.map((a) => a.login)).select('login', 'role', 'subject');
    expect(users).toHaveLength(5);
    for (const account of DEMO_ACCOUNTS) expect(users).toContainEqual({ login: account.login, role: account.role, subject: account.subject });
    const ownerTeams = await tdb.db('team_members as m').join('users as u', 'u.id', 'm.user_id').join('teams as t', 't.id', 'm.team_id').where('u.login', 'owner').pluck('t.slug');
    expect(ownerTeams).toEqual(['payments']);
  });

  it('when the demo accounts are listed, then each has a .test address and a distinct login and subject', () => {
    expect(new Set(DEMO_ACCOUNTS.map((a) => a.login)).size).toBe(DEMO_ACCOUNTS.length);
    expect(new Set(DEMO_ACCOUNTS.map((a) => a.subject)).size).toBe(DEMO_ACCOUNTS.length);
    for (const account of DEMO_ACCOUNTS) expect(account.email).toMatch(/^[a-z.]+@[a-z]+\.test$/);
  });
});
