import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../../backend/src/app';
import { ROLES, atLeast } from '../../../backend/src/auth/roles';
import { testConfig } from '../../setup/database';
import { apiRoutes, type ApiRoute } from './api-routes';
import { CALLERS, signInEveryone, type CallerName, type Callers } from './callers';
import { startSignInWorld, type SignInWorld } from './sign-in-harness';

type Expected = Record<CallerName, number>;
const everyone = (status: number, overrides: Partial<Expected> = {}): Expected =>
  ({ ...Object.fromEntries(CALLERS.map((c) => [c, status])), anonymous: 401, ...overrides }) as Expected;
const adminOnly = (status: number): Expected => everyone(403, { admin: status });

interface Row {
  method: string;
  /** The route as declared, e.g. /api/v1/users/:id. */
  route: string;
  /** The concrete request. */
  path: (ids: World) => string;
  body?: unknown;
  expected: Expected;
}

interface World {
  payments: number;
  search: number;
  viewerId: number;
}

// Bodies are chosen so that a caller who is let in gets a definite answer (often a 400) without changing
// what the other rows see. The token is the sre's, and carries the sre role.
const TABLE: Row[] = [
  { method: 'GET', route: '/api/health', path: () => '/api/health', expected: everyone(200, { anonymous: 200 }) },
  { method: 'GET', route: '/api/auth/login', path: () => '/api/auth/login', expected: everyone(303, { anonymous: 303, token: 400 }) },
  { method: 'GET', route: '/api/auth/callback', path: () => '/api/auth/callback', expected: everyone(303, { anonymous: 303, token: 400 }) },
  { method: 'GET', route: '/api/auth/me', path: () => '/api/auth/me', expected: everyone(200) },
  { method: 'GET', route: '/api/v1/users', path: () => '/api/v1/users', expected: adminOnly(200) },
  { method: 'PATCH', route: '/api/v1/users/:id', path: (w) => `/api/v1/users/${w.viewerId}`, body: { role: 'overlord' }, expected: adminOnly(400) },
  { method: 'GET', route: '/api/v1/teams', path: () => '/api/v1/teams', expected: everyone(200) },
  { method: 'POST', route: '/api/v1/teams', path: () => '/api/v1/teams', body: {}, expected: adminOnly(400) },
  // The owner belongs to payments, not to search: the per-item check.
  { method: 'PATCH', route: '/api/v1/teams/:id', path: (w) => `/api/v1/teams/${w.payments}`, body: { alertEmail: 'payments-alerts@larkfield.test' }, expected: everyone(200, { viewer: 403, responder: 403 }) },
  { method: 'PATCH', route: '/api/v1/teams/:id', path: (w) => `/api/v1/teams/${w.search}`, body: { alertEmail: 'search-alerts@larkfield.test' }, expected: everyone(200, { viewer: 403, responder: 403, owner: 403 }) },
  { method: 'PUT', route: '/api/v1/teams/:id/members/:userId', path: (w) => `/api/v1/teams/${w.search}/members/${w.viewerId}`, body: { wantsAlertMail: 'yes' }, expected: adminOnly(400) },
  { method: 'DELETE', route: '/api/v1/teams/:id/members/:userId', path: (w) => `/api/v1/teams/${w.search}/members/999999`, expected: adminOnly(404) },
  { method: 'GET', route: '/api/v1/tokens', path: () => '/api/v1/tokens', expected: everyone(200) },
  { method: 'POST', route: '/api/v1/tokens', path: () => '/api/v1/tokens', body: { label: '' }, expected: everyone(400, { token: 403 }) },
  { method: 'DELETE', route: '/api/v1/tokens/:id', path: () => '/api/v1/tokens/999999', expected: everyone(404) },
  { method: 'GET', route: '/api/v1/audit', path: () => '/api/v1/audit', expected: adminOnly(200) },
  // Uploads and history: a JSON body where a multipart form is expected gets a 400 from those let in.
  { method: 'GET', route: '/api/v1/dumps', path: () => '/api/v1/dumps', expected: everyone(200) },
  { method: 'GET', route: '/api/v1/dumps/:id', path: () => '/api/v1/dumps/999999', expected: everyone(404) },
  { method: 'POST', route: '/api/v1/dumps', path: () => '/api/v1/dumps', body: {}, expected: everyone(400, { viewer: 403 }) },
  { method: 'GET', route: '/api/v1/history', path: () => '/api/v1/history', expected: everyone(200) },
  { method: 'GET', route: '/api/v1/history.csv', path: () => '/api/v1/history.csv', expected: everyone(200) },
  { method: 'GET', route: '/api/v1/sizing/plan', path: () => '/api/v1/sizing/plan', expected: everyone(400, { anonymous: 400 }) },
  { method: 'GET', route: '/api/v1/sizing/assess', path: () => '/api/v1/sizing/assess', expected: everyone(400, { anonymous: 400 }) },
  { method: 'GET', route: '/api/v1/sketches/:id/audit', path: () => '/api/v1/sketches/999999/audit', expected: everyone(404) },
  { method: 'GET', route: '/api/v1/imports/sketches/columns', path: () => '/api/v1/imports/sketches/columns', expected: everyone(200) },
  { method: 'GET', route: '/api/v1/imports/sketches/template', path: () => '/api/v1/imports/sketches/template', expected: everyone(200) },
  { method: 'POST', route: '/api/v1/imports/sketches/preview', path: () => '/api/v1/imports/sketches/preview', body: {}, expected: everyone(400, { viewer: 403, responder: 403 }) },
  { method: 'POST', route: '/api/v1/imports/sketches', path: () => '/api/v1/imports/sketches', body: {}, expected: everyone(400, { viewer: 403, responder: 403 }) },
  // Last: it ends the sessions the rows above use.
  { method: 'POST', route: '/api/auth/logout', path: () => '/api/auth/logout', expected: everyone(204, { anonymous: 204 }) },
];

async function call(world: SignInWorld, callers: Callers, caller: CallerName, method: string, path: string, body?: unknown): Promise<number> {
  const res = await fetch(world.appUrl + path, {
    method,
    redirect: 'manual',
    headers: { ...callers.headers(caller), ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  await res.arrayBuffer();
  return res.status;
}

describe('every API route × every caller', () => {
  let world: SignInWorld;
  let callers: Callers;
  let ids: World;
  beforeAll(async () => {
    world = await startSignInWorld();
    callers = await signInEveryone(world);
    const [payments, search] = await world.tdb.db('teams').insert([{ slug: 'payments', name: 'Payments' }, { slug: 'search', name: 'Search' }], ['id']);
    await world.tdb.db('team_members').insert({ team_id: payments.id, user_id: callers.userId('owner') });
    ids = { payments: Number(payments.id), search: Number(search.id), viewerId: callers.userId('viewer') };
  });
  afterAll(async () => {
    await world.close();
  });

  // Derived from each route's own declaration, so a route added later is checked with no new row:
  // refusals never reach the handler, so these calls change nothing.
  it('when any declared route is called by someone it does not let in, then it refuses with 401 or 403', async () => {
    const app = createApp({ config: testConfig(world.tdb.url), db: world.tdb.db });
    const routes: ApiRoute[] = apiRoutes(app).filter((r) => r.permission && r.permission.access !== 'public');
    await closeApp(app);
    expect(routes.length).toBeGreaterThan(5);
    const wrong: string[] = [];
    for (const route of routes) {
      const access = route.permission!.access as (typeof ROLES)[number];
      const path = route.path.replace(/:\w+/g, '999999');
      const refused: [CallerName, number][] = [['anonymous', 401], ...ROLES.filter((r) => !atLeast(r, access)).map((r) => [r, 403] as [CallerName, number])];
      if (route.permission!.sessionOnly || !atLeast(callers.tokenRole, access)) refused.push(['token', 403]);
      for (const [caller, expected] of refused) {
        const status = await call(world, callers, caller, route.method, path, route.method === 'GET' ? undefined : {});
        if (status !== expected) wrong.push(`${route.method} ${path} as ${caller}: ${status}, expected ${expected}`);
      }
    }
    expect(wrong).toEqual([]);
  });

  it('when the table is compared with the app, then every row names a route the app has', () => {
    const app = createApp({ config: testConfig(world.tdb.url), db: world.tdb.db });
    const known = new Set(apiRoutes(app).map((r) => `${r.method} ${r.path}`));
    void closeApp(app);
    expect(TABLE.map((r) => `${r.method} ${r.route}`).filter((r) => !known.has(r))).toEqual([]);
  });

  // Runs last: its final row signs everyone out.
  it('when each row of the table is called by each caller, then the status is the expected one', async () => {
    const wrong: string[] = [];
    for (const row of TABLE) {
      for (const caller of CALLERS) {
        const status = await call(world, callers, caller, row.method, row.path(ids), row.body);
        if (status !== row.expected[caller]) wrong.push(`${row.method} ${row.path(ids)} as ${caller}: ${status}, expected ${row.expected[caller]}`);
      }
    }
    expect(wrong).toEqual([]);
  });
});
