import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EXPOSITION_CONTENT_TYPES } from '../../../backend/src/maths/exposition';
import { CountMinSketch } from '../../../backend/src/maths/sketch';
import { capacityOf } from '../../../backend/src/maths/sizing';
import { as, startSketchWorld, type SketchWorld } from './world';

/** A real service on loopback: one path answers a sketch's exposition, another garbage. */
async function startService(sketch: CountMinSketch) {
  const server = http.createServer((req, res) => {
    if (req.url === '/metrics') res.writeHead(200, { 'content-type': EXPOSITION_CONTENT_TYPES.openMetrics }).end(sketch.toExposition('per-card-limiter', { openMetrics: true }));
    else res.writeHead(200, { 'content-type': 'text/plain' }).end('<html>not metrics</html>\n');
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  return { url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, close: () => new Promise<void>((r) => server.close(() => r())) };
}

describe('testing a target before saving', () => {
  let w: SketchWorld;
  let owner: string;
  let service: Awaited<ReturnType<typeof startService>>;
  const sketch = new CountMinSketch({ width: 272, depth: 5, seed: 9 });
  beforeAll(async () => {
    for (let i = 0; i < 4000; i++) sketch.update(`card-${i % 300}`);
    w = await startSketchWorld();
    owner = await w.tokenFor('owner', ['payments']);
    service = await startService(sketch);
  });
  afterAll(async () => {
    await service.close();
    await w.close();
  });

  const test = (body: object) => as(w.app, owner).post('/api/v1/sketches/test-target').send(body);

  it('when the target speaks the exposition, then the answer holds what Brimwatch reads and the load it gives', async () => {
    const res = await test({ targetUrl: `${service.url}/metrics`, sketch: 'per-card-limiter', errorBudget: 100, confidence: 0.99 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      ok: true,
      reading: { width: 272, depth: 5, streamTotal: 4000, nonzeroCells: sketch.nonzeroCells(), counterBytes: 4, windowSeconds: 0, conservative: false, memoryBytes: 272 * 5 * 4 },
    });
    // load = n / (m·E·δ^(1/k)), DESIGN.md
    expect(res.body.assessment.load).toBeCloseTo(4000 / capacityOf(272, 5, 100, 0.01), 9);
    expect(res.body.assessment.level).toBe('clear');
    // Linear counting (Whang, Vander-Zanden & Taylor, ACM TODS 15(2), 1990): D ≈ −m·ln(V), V the zero fraction over the rows.
    const zeroFraction = 1 - sketch.nonzeroCells().reduce((a, b) => a + b, 0) / (272 * 5);
    expect(res.body.occupancy.zeroFraction).toBeCloseTo(zeroFraction, 12);
    expect(res.body.occupancy.distinctEstimate).toBeCloseTo(-272 * Math.log(zeroFraction), 6);
    expect(res.body.occupancy.distinctEstimate).toBeGreaterThan(250); // 300 distinct cards were fed
    expect(res.body.occupancy.distinctEstimate).toBeLessThan(350);
  });

  it('when the target answers something else, is refused, or lies outside the allowlist, then the answer says exactly why', async () => {
    const garbage = await test({ targetUrl: `${service.url}/other`, sketch: 'per-card-limiter' });
    expect(garbage.body).toMatchObject({ ok: false, kind: 'parse error', reason: expect.stringContaining('line 1') });
    const missing = await test({ targetUrl: `${service.url}/metrics`, sketch: 'no-such-sketch' });
    expect(missing.body).toMatchObject({ ok: false, kind: 'missing metric', reason: expect.stringContaining('sketch="no-such-sketch"') });
    const closed = await test({ targetUrl: 'http://127.0.0.1:1/metrics', sketch: 'per-card-limiter' });
    expect(closed.body).toMatchObject({ ok: false, kind: 'refused', reason: 'connection refused' });
    const outside = await test({ targetUrl: 'http://10.20.30.40/metrics', sketch: 'per-card-limiter' });
    expect(outside.body).toMatchObject({ ok: false, kind: 'not allowed', reason: expect.stringContaining('outside TARGET_ALLOWLIST') });
  });

  it('when a viewer tries it or the body is incomplete, then 403 or 400', async () => {
    const viewer = await w.tokenFor('viewer');
    expect((await as(w.app, viewer).post('/api/v1/sketches/test-target').send({ targetUrl: `${service.url}/metrics`, sketch: 'x' })).status).toBe(403);
    const res = await test({ targetUrl: `${service.url}/metrics` });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('sketch');
  });
});
