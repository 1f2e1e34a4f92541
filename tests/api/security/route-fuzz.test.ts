import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../../backend/src/app';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { testConfig } from '../../setup/database';
import { apiRoutes, type ApiRoute } from '../auth/api-routes';
import { signInThroughProvider, startSignInWorld, type CookieJar, type SignInWorld } from '../auth/sign-in-harness';
import { routeExamples, type RouteExample } from './route-examples';

/** Routes whose answer is a redirect by design (the sign-in flow), and sign-out, which would end the fuzzer's own session. */
const REDIRECTS = new Set(['GET /api/auth/login', 'GET /api/auth/callback']);
const SKIPPED = new Set(['POST /api/auth/logout']);
const RUNS = 25;

/** Text a client could plausibly send, and text no client should. */
const junkText = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.constantFrom('', ' ', '0', '-1', '1.5', '1e308', '-0', 'NaN', 'Infinity', 'null', 'true', '[]', '{}', '9'.repeat(40), "'; drop table sketches; --", '%00', '\u0000', '../../etc/passwd', '<script>alert(1)</script>', '2026-13-45T25:61:00Z', 'ünïcödé ✓'),
  fc.string({ unit: 'binary', maxLength: 20 }),
);
const junkValue: fc.Arbitrary<unknown> = fc.oneof(
  junkText,
  fc.double(),
  fc.integer(),
  fc.constantFrom(null, true, false, Number.MAX_SAFE_INTEGER + 2, -1, 0, 1e308),
  fc.array(junkText, { maxLength: 3 }),
  fc.dictionary(fc.string({ maxLength: 8 }), junkText, { maxKeys: 3 }),
);
/** Path parameters: real-looking ids and everything else. */
const junkId = fc.oneof(fc.integer({ min: 1, max: 50 }).map(String), fc.constantFrom('0', '-3', '1.5', '1e3', '99999999999999999999', 'abc', '%20', '%E2%9C%93', '..'));

function queryArbitrary(example: RouteExample | undefined): fc.Arbitrary<[string, string][]> {
  const known = example?.query ?? [];
  const key = known.length ? fc.oneof(fc.constantFrom(...known), fc.string({ minLength: 1, maxLength: 10 })) : fc.string({ minLength: 1, maxLength: 10 });
  return fc.array(fc.tuple(key, junkText), { maxLength: 4 });
}

function bodyArbitrary(example: RouteExample | undefined): fc.Arbitrary<unknown> {
  const base = example?.body ?? {};
  const fields = example?.fields?.length ? example.fields : Object.keys(base);
  const withField = fields.length
    ? fc.tuple(fc.constantFrom(...fields), junkValue).map(([field, value]) => ({ ...base, [field]: value }))
    : fc.constant(base);
  const withoutField = fields.length ? fc.constantFrom(...fields).map((field) => Object.fromEntries(Object.entries(base).filter(([k]) => k !== field))) : fc.constant({});
  return fc.oneof(
    withField,
    withoutField,
    fc.tuple(fc.string({ minLength: 1, maxLength: 10 }), junkValue).map(([key, value]) => ({ ...base, [key]: value })),
    fc.jsonValue({ maxDepth: 2 }),
    fc.constant(base),
  );
}

describe('every API route, fuzzed', () => {
  let world: SignInWorld;
  let jar: CookieJar;
  let routes: ApiRoute[];
  beforeAll(async () => {
    world = await startSignInWorld();
    await seedTeams(world.tdb.db);
    ({ jar } = await signInThroughProvider(world, 'admin'));
    const app = createApp({ config: testConfig(world.tdb.url), db: world.tdb.db });
    routes = apiRoutes(app);
    await closeApp(app);
  });
  afterAll(async () => {
    await world?.close();
  });

  /** Every stored row, hashed per table: a refused request must leave each the same. */
  const fingerprint = async () => {
    const tables = ['teams', 'users', 'team_members', 'services', 'sketches', 'targets', 'target_status', 'alerts', 'quiet_windows', 'api_tokens', 'audit_log', 'dump_reports', 'mail_outbox'];
    const { rows } = await world.tdb.db.raw(`select ${tables.map((t) => `(select coalesce(sum(hashtext(x::text)::bigint), 0) || ':' || count(*) from ${t} x) as ${t}`).join(', ')}`);
    return rows[0] as Record<string, string>;
  };

  it('when any route gets junk in its query, path or body, then it answers 2xx or a 4xx that says what is wrong, never a 500, and a refusal changes no stored row', async () => {
    const examples = routeExamples();
    const fuzzed = routes.filter((r) => !SKIPPED.has(`${r.method} ${r.path}`));
    expect(fuzzed.length).toBeGreaterThan(30);
    const problems: string[] = [];
    for (const route of fuzzed) {
      const name = `${route.method} ${route.path}`;
      const example = examples[name];
      const sendsBody = !['GET', 'DELETE'].includes(route.method);
      await fc.assert(
        fc.asyncProperty(fc.array(junkId, { minLength: 2, maxLength: 2 }), queryArbitrary(example), sendsBody ? bodyArbitrary(example) : fc.constant(undefined), async (ids, query, body) => {
          let path = route.path;
          for (const id of ids) path = path.replace(/:\w+/, id);
          const search = new URLSearchParams(query).toString();
          const before = await fingerprint();
          const res = await fetch(`${world.appUrl}${path}${search ? `?${search}` : ''}`, {
            method: route.method,
            redirect: 'manual',
            headers: { cookie: jar.header(), origin: world.appUrl, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
            body: body === undefined ? undefined : JSON.stringify(body),
          });
          const text = await res.text();
          const request = `${route.method} ${path}${search ? `?${search}` : ''} ${body === undefined ? '' : JSON.stringify(body).slice(0, 200)}`;
          if (res.status >= 500) problems.push(`${request} → ${res.status} ${text.slice(0, 200)}`);
          else if (res.status >= 300 && res.status < 400 && !REDIRECTS.has(name)) problems.push(`${request} → unexpected redirect ${res.status}`);
          else if (res.status >= 400) {
            const message = (() => {
              try {
                return JSON.parse(text).error?.message;
              } catch {
                return undefined;
              }
            })();
            if (typeof message !== 'string' || message.length < 15) problems.push(`${request} → ${res.status} without a clear message: ${text.slice(0, 200)}`);
            const after = await fingerprint();
            const changed = Object.keys(before).filter((t) => before[t] !== after[t]);
            if (changed.length) problems.push(`${request} → ${res.status}, yet changed ${changed.join(', ')}`);
          } else if (route.method === 'GET') {
            const after = await fingerprint();
            const changed = Object.keys(before).filter((t) => before[t] !== after[t] && t !== 'api_tokens');
            if (changed.length) problems.push(`${request} → ${res.status}, a read that changed ${changed.join(', ')}`);
          }
        }),
        { numRuns: RUNS, seed: 20261201 },
      );
      expect(problems, name).toEqual([]);
    }
  }, 600_000);
});
