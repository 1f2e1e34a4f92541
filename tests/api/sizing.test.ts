import createCountMinSketch from 'count-min-sketch';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeApp, createApp } from '../../backend/src/app';
import { createTestDatabase, testConfig, type TestDatabase } from '../setup/database';

// Public sizing API: no sign-in, pure maths over the query.
describe('GET /api/v1/sizing/plan and /assess', () => {
  let tdb: TestDatabase;
  let app: ReturnType<typeof createApp>;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    app = createApp({ config: testConfig(tdb.url), db: tdb.db, log: () => {} });
  });
  afterAll(async () => {
    await closeApp(app);
    await tdb.drop();
  });
  const get = (path: string) => request(app).get(path);

  it('when ε = 0.01 and δ = 0.01 are asked for, anonymously, then the width and depth are 272 × 5', async () => {
    // Cormode & Muthukrishnan, J. Algorithms 55(1) 2005: w = ⌈e/ε⌉ = ⌈271.83⌉ = 272, d = ⌈ln(1/δ)⌉ = ⌈4.605⌉ = 5.
    const res = await get('/api/v1/sizing/plan?sizedTotal=10000&errorBudget=100&confidence=0.99');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ width: 272, depth: 5, memoryBytes: 272 * 5 * 4 });
    expect(res.body.epsilon).toBeCloseTo(0.01, 12);
    expect(res.body.delta).toBeCloseTo(0.01, 12);
    // Hand computation from DESIGN.md: capacity = m·E·δ^(1/k) = 272 · 100 · 0.01^(1/5) = 27 200 · 0.398107… ≈ 10 828.5.
    expect(res.body.capacity).toBeCloseTo(10_828.5, 0);
  });

  it('when other designs are asked for, then width and depth agree with the independent count-min-sketch library', async () => {
    const designs = [
      { sizedTotal: 5_000_000, errorBudget: 250, confidence: 0.999, counterBytes: 8 },
      { sizedTotal: 123_456, errorBudget: 7, confidence: 0.9 },
      { sizedTotal: 1e9, errorBudget: 10_000, confidence: 0.95, counterBytes: 2 },
    ];
    for (const d of designs) {
      const query = new URLSearchParams(Object.entries(d).map(([k, v]): [string, string] => [k, String(v)]));
      const res = await get(`/api/v1/sizing/plan?${query}`);
      expect(res.status).toBe(200);
      const theirs = createCountMinSketch(d.errorBudget / d.sizedTotal, 1 - d.confidence); // npm count-min-sketch: (ε, δ)
      expect([res.body.width, res.body.depth]).toEqual([theirs.width, theirs.depth]);
      expect(res.body.memoryBytes).toBe(theirs.width * theirs.depth * (d.counterBytes ?? 4));
    }
  });

  it('when a 272 × 5 sketch is assessed at its sized total and at twice it, then it reads watch, then brimmed', async () => {
    const at = async (n: number) => (await get(`/api/v1/sizing/assess?width=272&depth=5&errorBudget=100&confidence=0.99&streamTotal=${n}`)).body;
    const sized = await at(10_000);
    // Hand computation: B = n/(m·δ^(1/k)) = 10 000/(272 · 0.398107) ≈ 92.35; load = B/E ≈ 0.9235 (≥ 0.8 watch line).
    expect(sized.boundNow).toBeCloseTo(92.35, 1);
    expect(sized.load).toBeCloseTo(0.9235, 3);
    // Miss risk (n/(m·E))^k = (10 000/27 200)^5 = 0.367647^5 ≈ 6.717 × 10⁻³.
    expect(sized.missRisk).toBeCloseTo(6.717e-3, 5);
    // Relative error δ^(−1/k)/m = 2.511886/272 ≈ 9.235 × 10⁻³.
    expect(sized.relativeError).toBeCloseTo(9.235e-3, 5);
    expect(sized.level).toBe('watch');
    const doubled = await at(20_000);
    expect(doubled.level).toBe('brimmed');
    expect(doubled.missRisk).toBeCloseTo(Math.pow(20_000 / 27_200, 5), 10);
  });

  it('when the stream total reaches width × budget, then the miss risk is null with a note instead of a number', async () => {
    const res = await get('/api/v1/sizing/assess?width=272&depth=5&errorBudget=100&confidence=0.99&streamTotal=27200');
    expect(res.status).toBe(200);
    expect(res.body.missRisk).toBeNull();
    expect(res.body.note).toMatch(/no guarantee/);
  });

  it.each([
    ['/api/v1/sizing/plan?errorBudget=100&confidence=0.99', 'sizedTotal', /missing/],
    ['/api/v1/sizing/plan?sizedTotal=lots&errorBudget=100&confidence=0.99', 'sizedTotal', /must be a number/],
    ['/api/v1/sizing/plan?sizedTotal=0&errorBudget=100&confidence=0.99', 'sizedTotal', /greater than 0/],
    ['/api/v1/sizing/plan?sizedTotal=1000&errorBudget=-5&confidence=0.99', 'errorBudget', /greater than 0/],
    ['/api/v1/sizing/plan?sizedTotal=1000&errorBudget=5&confidence=1', 'confidence', /confidence/],
    ['/api/v1/sizing/plan?sizedTotal=1000&errorBudget=5&confidence=99', 'confidence', /confidence/],
    ['/api/v1/sizing/plan?sizedTotal=1000&errorBudget=5&confidence=0.99&counterBytes=3', 'counterBytes', /counterBytes/],
    ['/api/v1/sizing/plan?sizedTotal=1e30&errorBudget=1&confidence=0.99', 'errorBudget', /absurd size: .* needs more than 2\^31 counters per row; raise errorBudget or lower sizedTotal/],
    ['/api/v1/sizing/plan?sizedTotal=1000&errorBudget=5&confidence=0.99&sizedtotal=3', 'sizedtotal', /Unknown parameter/],
    ['/api/v1/sizing/assess?width=272.5&depth=5&errorBudget=100&confidence=0.99&streamTotal=1', 'width', /whole number/],
    ['/api/v1/sizing/assess?width=272&depth=5&errorBudget=100&confidence=0.99&streamTotal=-1', 'streamTotal', /0 or more/],
  ])('when %s is asked, then a 400 names %s and says what to send', async (path, field, message) => {
    const res = await get(path);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid');
    expect(res.body.error.field).toBe(field);
    expect(res.body.error.message).toMatch(message);
  });
});
