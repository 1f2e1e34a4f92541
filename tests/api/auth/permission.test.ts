import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Caller } from '../../../backend/src/auth/caller';
import { allow } from '../../../backend/src/auth/permission';
import { ROLES, type Role } from '../../../backend/src/auth/roles';
import { assertTeamAccess } from '../../../backend/src/auth/team-access';
import { AppError, errorHandler } from '../../../backend/src/http/errors';
import { createTestDatabase, type TestDatabase } from '../../setup/database';

const caller = (role: Role, teamIds: number[] = [], via: Caller['via'] = 'session'): Caller => ({
  id: 1, login: role, name: role, email: null, role, teamIds, via,
});

/** A bare app whose caller is named by test headers, to exercise allow() alone; the real identification is tested with the sign-in flow. */
function probeApp(handler: express.RequestHandler) {
  const app = express();
  app.use((req, _res, next) => {
    const role = req.get('x-test-role') as Role | undefined;
    if (role) req.user = caller(role, [], req.get('x-test-via') === 'token' ? 'token' : 'session');
    next();
  });
  app.get('/probe', handler, (_req, res) => void res.json({ ok: true }));
  app.use(errorHandler(() => {}));
  return app;
}

describe('allow(...)', () => {
  it('when a route is public, then an anonymous caller gets through', async () => {
    const res = await request(probeApp(allow('public'))).get('/probe');
    expect(res.status).toBe(200);
  });

  it('when nobody is signed in, then an owner route answers 401 saying how to sign in', async () => {
    const res = await request(probeApp(allow('owner'))).get('/probe');
    expect(res.status).toBe(401);
    expect(res.body.error).toMatchObject({ code: 'signed_out' });
    expect(res.body.error.message).toMatch(/\/api\/auth\/login/);
  });

  it.each(ROLES.map((role, rank) => [role, rank >= ROLES.indexOf('owner') ? 200 : 403] as const))(
    'when a %s calls an owner route, then it answers %i',
    async (role, status) => {
      const res = await request(probeApp(allow('owner'))).get('/probe').set('x-test-role', role);
      expect(res.status).toBe(status);
      if (status === 403) expect(res.body.error.message).toMatch(`This needs the owner role or higher; you are ${role}`);
    },
  );

  it('when an API token calls a session-only route, then it answers 403 even for an admin token', async () => {
    const app = probeApp(allow('viewer', { sessionOnly: true }));
    const res = await request(app).get('/probe').set('x-test-role', 'admin').set('x-test-via', 'token');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('session_only');
    expect((await request(app).get('/probe').set('x-test-role', 'viewer')).status).toBe(200);
  });
});

describe('assertTeamAccess on a sketch row', () => {
  let tdb: TestDatabase;
  let sketchTeam: number;
  let otherTeam: number;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    [{ id: sketchTeam }, { id: otherTeam }] = await tdb.db('teams').insert([{ slug: 'checkout', name: 'Checkout' }, { slug: 'search', name: 'Search' }], ['id']);
    const [service] = await tdb.db('services').insert({ team_id: sketchTeam, name: 'checkout-api' }, ['id']);
    await tdb.db('sketches').insert({ service_id: service.id, team_id: sketchTeam, name: 'card_attempts', error_budget: 50, confidence: 0.99 });
  });
  afterAll(async () => {
    await tdb.drop();
  });

  const teamOfSketch = async () => Number((await tdb.db('sketches').where({ name: 'card_attempts' }).first('team_id')).team_id);

  it('when an owner of another team edits the sketch, then it is refused with 403 naming the reason', async () => {
    const attempt = async () => assertTeamAccess(caller('owner', [otherTeam]), await teamOfSketch(), 'edit this sketch');
    await expect(attempt()).rejects.toSatisfy((e: unknown) => e instanceof AppError && e.status === 403 && e.code === 'not_your_team' && /only the sketches of your own teams/.test(e.message));
  });

  it('when an owner of the sketch team, an sre or an admin edits it, then it is allowed', async () => {
    const team = await teamOfSketch();
    expect(() => assertTeamAccess(caller('owner', [otherTeam, sketchTeam]), team, 'edit this sketch')).not.toThrow();
    expect(() => assertTeamAccess(caller('sre'), team, 'edit this sketch')).not.toThrow();
    expect(() => assertTeamAccess(caller('admin'), team, 'edit this sketch')).not.toThrow();
  });

  it('when a responder in the team edits it, then it is refused: the role is too low', () => {
    expect(() => assertTeamAccess(caller('responder', [sketchTeam]), sketchTeam, 'edit this sketch')).toThrow(/you are responder/);
  });
});
