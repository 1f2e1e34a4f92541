import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../backend/src/app';
import { createTestDatabase, testConfig, type TestDatabase } from '../setup/database';

const run = promisify(execFile);

// Each command is a fresh tsx process (a few seconds each on a busy machine).
describe('npm run admin', { timeout: 90_000 }, () => {
  let tdb: TestDatabase;
  beforeAll(async () => {
    tdb = await createTestDatabase();
  });
  afterAll(async () => {
    await tdb.drop();
  });

  const admin = (...args: string[]) =>
    run(process.execPath, ['--import', 'tsx', path.resolve('ops/admin.ts'), ...args], { env: { ...process.env, DATABASE_URL: tdb.url, NODE_ENV: 'test' } })
      .then((r) => ({ code: 0, stdout: r.stdout, stderr: r.stderr }))
      .catch((e: { code: number; stdout: string; stderr: string }) => ({ code: e.code, stdout: e.stdout, stderr: e.stderr }));

  it('when a token is made for the demo sre before anyone signed in, then its last line is a token that works as a bearer', async () => {
    const out = await admin('token', 'create', '--login', 'sre', '--label', 'check');
    expect(out.code).toBe(0);
    const token = out.stdout.trim().split('\n').at(-1)!;
    expect(token).toMatch(/^bwt_[A-Za-z0-9_-]{43}$/);
    expect(await tdb.db('users').where({ login: 'sre' }).first()).toMatchObject({ role: 'sre', subject: 'lm-0002' });

    const app = createApp({ config: testConfig(tdb.url), db: tdb.db, log: () => {} });
    const me = await request(app).get('/api/auth/me').set('authorization', `Bearer ${token}`);
    await closeApp(app);
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ login: 'sre', role: 'sre', via: 'token' });
    expect(await tdb.db('audit_log').where({ action: 'token.created' }).first()).toMatchObject({ actor: expect.stringMatching(/^cli:/) });
  });

  it('when a role is set, then the user has it and the change is audited', async () => {
    const out = await admin('user', 'role', '--login', 'sre', '--role', 'owner');
    expect(out.code).toBe(0);
    expect(out.stdout).toMatch(/sre is now owner/);
    expect((await tdb.db('users').where({ login: 'sre' }).first()).role).toBe('owner');
    expect(await tdb.db('audit_log').where({ action: 'user.role_changed' }).first()).toMatchObject({ before: { role: 'sre' }, after: { role: 'owner' } });
  });

  it('when the role is unknown, the label empty or the login not a user, then it exits non-zero saying why and writes nothing', async () => {
    const tokensBefore = await tdb.db('api_tokens').count('id as n').first();
    const badRole = await admin('user', 'role', '--login', 'sre', '--role', 'overlord');
    expect(badRole.code).toBe(2);
    expect(badRole.stderr).toMatch(/--role must be one of viewer, responder, owner, sre, admin/);
    const noLabel = await admin('token', 'create', '--login', 'sre', '--label', ' ');
    expect(noLabel.stderr).toMatch(/--label is required/);
    const stranger = await admin('token', 'create', '--login', 'nobody', '--label', 'x');
    expect(stranger.code).toBe(2);
    expect(stranger.stderr).toMatch(/There is no user "nobody"/);
    expect(await tdb.db('api_tokens').count('id as n').first()).toEqual(tokensBefore);
    expect(await tdb.db('users').where({ login: 'nobody' }).first()).toBeUndefined();
  });
});
