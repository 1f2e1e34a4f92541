import { Router, type Request } from 'express';
import { allow } from '../auth/permission';
import { AppError } from '../http/errors';
import { assess, plan, SketchMathsError } from '../maths';

/**
 * Public sizing answers: pure maths over the query, no stored data, so no
 * sign-in. Every bad value is a 400 naming the parameter and what to send.
 */
const PLAN_PARAMS = ['sizedTotal', 'errorBudget', 'confidence', 'counterBytes'] as const;
const ASSESS_PARAMS = ['width', 'depth', 'errorBudget', 'confidence', 'streamTotal'] as const;

const HINTS: Record<string, string> = {
  sizedTotal: 'the stream total the sketch must hold, e.g. sizedTotal=1000000',
  errorBudget: 'the largest overcount tolerated, e.g. errorBudget=100',
  confidence: 'a fraction between 0 and 1, e.g. confidence=0.99',
  counterBytes: 'bytes per counter: 1, 2, 4 or 8 (default 4)',
  width: 'counters per row, e.g. width=2719',
  depth: 'rows, e.g. depth=5',
  streamTotal: 'the sum of all increments so far, e.g. streamTotal=250000',
};

function numbersFrom<K extends string>(req: Request, names: readonly K[], optional: readonly K[] = []): Record<K, number | undefined> {
  const unknown = Object.keys(req.query).filter((k) => !(names as readonly string[]).includes(k));
  if (unknown.length) throw new AppError(400, 'invalid', `Unknown parameter ${unknown.join(', ')}; the accepted ones are ${names.join(', ')}.`, unknown[0]);
  const out = {} as Record<K, number | undefined>;
  for (const name of names) {
    const raw = req.query[name];
    if (raw === undefined || raw === '') {
      if (optional.includes(name)) continue;
      throw new AppError(400, 'invalid', `${name} is missing; send ${HINTS[name]}.`, name);
    }
    const value = typeof raw === 'string' ? Number(raw.trim()) : NaN;
    if (typeof raw !== 'string' || raw.trim() === '' || !Number.isFinite(value)) {
      throw new AppError(400, 'invalid', `${name} must be a number (got '${String(raw)}'); send ${HINTS[name]}.`, name);
    }
    out[name] = value;
  }
  return out;
}

function answer<T>(compute: () => T): T {
  try {
    return compute();
  } catch (err) {
    if (err instanceof SketchMathsError) throw new AppError(400, 'invalid', err.message, err.field, { cause: err });
    throw err;
  }
}

export function sizingRoutes(): Router {
  const router = Router();
  router.get('/v1/sizing/plan', allow('public'), (req, res) => {
    const q = numbersFrom(req, PLAN_PARAMS, ['counterBytes']);
    const p = answer(() => plan({ sizedTotal: q.sizedTotal!, errorBudget: q.errorBudget!, confidence: q.confidence!, counterBytes: q.counterBytes ?? 4 }));
    res.json({ width: p.width, depth: p.depth, epsilon: p.epsilon, delta: p.delta, memoryBytes: p.memoryBytes, capacity: p.capacity });
  });
  router.get('/v1/sizing/assess', allow('public'), (req, res) => {
    const q = numbersFrom(req, ASSESS_PARAMS);
    const a = answer(() => assess({ width: q.width!, depth: q.depth!, errorBudget: q.errorBudget!, confidence: q.confidence!, streamTotal: q.streamTotal! }));
    res.json({
      boundNow: a.boundNow,
      capacity: a.capacity,
      load: a.load,
      missRisk: a.missRisk,
      ...(a.missRisk === null ? { note: 'no guarantee: the stream total has reached width × error budget, so the Markov bound says nothing' } : {}),
      relativeError: a.relativeError,
      level: a.level,
    });
  });
  return router;
}
