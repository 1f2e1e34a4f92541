import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { capacityOf } from '../../../backend/src/maths/sizing';
import { parseExposition } from '../../../collectors/exposition/text-format';
import { addSketch } from './fixtures';
import { startSketchWorld, type SketchWorld } from './world';

const CAPACITY = capacityOf(272, 5, 100, 0.01);

describe("the web server's own /metrics", () => {
  let w: SketchWorld;
  beforeAll(async () => {
    w = await startSketchWorld();
    await addSketch(w.db, { service: 'checkout', sketch: 'per-card-limiter', team: 'payments', instances: [{ instance: 'a', streamTotal: Math.round(0.5 * CAPACITY) }] });
    await addSketch(w.db, {
      service: 'api-gateway',
      sketch: 'per-key-quota',
      team: 'edge',
      instances: [
        { instance: 'gw-1', streamTotal: Math.round(0.2 * CAPACITY) },
        { instance: 'gw-2', streamTotal: Math.round(1.1 * CAPACITY) },
      ],
    });
    await addSketch(w.db, { service: 'search', sketch: 'heavy-queries', team: 'discovery', instances: [{ instance: 'a' }] });
  });
  afterAll(() => w.close());

  it('when a metrics system scrapes with a viewer token, then it reads sketches per level and the load of each read sketch', async () => {
    const token = await w.tokenFor('viewer');
    const res = await request(w.app).get('/metrics').set('authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/);
    const parsed = parseExposition(res.text, 'prometheus');
    if (!parsed.ok) throw new Error(parsed.reason);
    const value = (name: string, labels: Record<string, string>) =>
      parsed.samples.find((s) => s.name === name && Object.entries(labels).every(([k, v]) => s.labels[k] === v))?.value;
    expect(value('brimwatch_sketches', { level: 'clear' })).toBe(1);
    expect(value('brimwatch_sketches', { level: 'brimmed' })).toBe(1);
    expect(value('brimwatch_sketches', { level: 'stale' })).toBe(1);
    expect(value('brimwatch_sketches', { level: 'watch' })).toBe(0);
    expect(value('brimwatch_sketch_load', { service: 'api-gateway', sketch: 'per-key-quota', team: 'edge' })).toBeCloseTo(1.1, 3);
    expect(value('brimwatch_sketch_load', { service: 'search' })).toBeUndefined();
  });

  it('when nobody signs in, then /metrics answers 401 rather than the fleet', async () => {
    const res = await request(w.app).get('/metrics');
    expect(res.status).toBe(401);
    expect(res.text).not.toContain('brimwatch_sketch_load');
  });
});
