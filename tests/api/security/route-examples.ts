import { z } from 'zod';
import { fleetQueryInput, historyQueryInput } from '../../../backend/src/routes/fleet-input';
import { changeInput, registrationInput, testTargetInput } from '../../../backend/src/routes/sketch-input';
import { acknowledgeInput, alertListInput, quietListInput, quietWindowInput } from '../../../backend/src/routes/alert-input';

export interface RouteExample {
  /** Query parameters the route reads; taken from its schema where the schema is exported. */
  query?: string[];
  /** A body the route accepts, the start of every mutation. */
  body?: Record<string, unknown>;
  /** Every field the body may carry (from the schema where exported), each also fuzzed on its own. */
  fields?: string[];
}

/** The input fields a zod schema names, read from its JSON Schema (as the input side, before transforms). */
function fieldsOf(schema: z.ZodType): string[] {
  const json = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as { properties?: Record<string, unknown>; allOf?: { properties?: Record<string, unknown> }[] };
  return Object.keys(json.properties ?? json.allOf?.[0]?.properties ?? {});
}

const inAWeek = () => new Date(Date.now() + 7 * 86_400_000).toISOString();

/**
 * What each route takes, for the fuzzer to start from. A route that is not
 * here is still fuzzed, from arbitrary queries and bodies; the valid examples
 * only let mutations reach deeper than the first check. Target URLs point at
 * loopback literals, so no fuzzed request ever resolves a name on the network.
 */
export function routeExamples(): Record<string, RouteExample> {
  return {
    'GET /api/v1/sketches': { query: fieldsOf(fleetQueryInput) },
    'GET /api/v1/sketches/:id/readings': { query: fieldsOf(historyQueryInput) },
    'GET /api/v1/alerts': { query: fieldsOf(alertListInput) },
    'GET /api/v1/quiet-windows': { query: fieldsOf(quietListInput) },
    'GET /api/v1/history': { query: ['from', 'to', 'team', 'service', 'sketch', 'page', 'pageSize'] },
    'GET /api/v1/history.csv': { query: ['from', 'to', 'team', 'service', 'sketch', 'page', 'pageSize'] },
    'GET /api/v1/audit': { query: ['actor', 'action', 'subjectType', 'subjectId', 'from', 'to', 'page', 'pageSize'] },
    'GET /api/v1/sketches/:id/audit': { query: ['page', 'pageSize'] },
    'GET /api/v1/dumps': { query: ['limit', 'before', 'sketchId'] },
    'GET /api/v1/tokens': { query: ['scope'] },
    'POST /api/v1/sketches': {
      query: [],
      body: { service: 'checkout', sketch: 'fuzzed-limiter', team: 'payments', targetUrl: 'http://127.0.0.1:9/metrics', errorBudget: 100, confidence: 0.99 },
      fields: fieldsOf(registrationInput),
    },
    'PATCH /api/v1/sketches/:id': { body: { errorBudget: 250, watchLine: 0.75 }, fields: fieldsOf(changeInput) },
    'POST /api/v1/sketches/test-target': { body: { targetUrl: 'http://127.0.0.1:9/metrics', sketch: 'per-card-limiter' }, fields: fieldsOf(testTargetInput) },
    'POST /api/v1/teams': { body: { slug: 'fuzzed-team', name: 'Fuzzed Team', alertEmail: 'fuzzed@larkfield.test' } },
    'PATCH /api/v1/teams/:id': { body: { alertEmail: 'payments-alerts@larkfield.test' } },
    'PUT /api/v1/teams/:id/members/:userId': { body: { wantsAlertMail: true } },
    'PATCH /api/v1/users/:id': { body: { role: 'responder' } },
    'POST /api/v1/tokens': { body: { label: 'fuzzed token', expiresInDays: 1 } },
    'POST /api/v1/alerts/:id/acknowledge': { body: { note: 'resizing today' }, fields: fieldsOf(acknowledgeInput) },
    'POST /api/v1/quiet-windows': { body: { scope: 'team', team: 'payments', endsAt: inAWeek(), reason: 'load test' }, fields: fieldsOf(quietWindowInput) },
  };
}
