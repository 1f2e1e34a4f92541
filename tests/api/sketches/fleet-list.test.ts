import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { capacityOf } from '../../../backend/src/maths/sizing';
import { addSketch } from './fixtures';
import { as, startSketchWorld, type SketchWorld } from './world';

// Every fixture sketch is 272 × 5 with budget 100 at 99 %: capacity m·E·δ^(1/k) (DESIGN.md), about 10,833.
const CAPACITY = capacityOf(272, 5, 100, 0.01);
const atLoad = (load: number) => Math.round(load * CAPACITY);
const DAY = 86_400_000;

describe('the fleet list', () => {
  let w: SketchWorld;
  let viewer: string;
  const ids: Record<string, number> = {};
  beforeAll(async () => {
    w = await startSketchWorld();
    viewer = await w.tokenFor('viewer');
    const add = async (key: string, f: Parameters<typeof addSketch>[1]) => (ids[key] = (await addSketch(w.db, f)).id);
    await add('calm', { service: 'checkout', sketch: 'calm', team: 'payments', instances: [{ instance: 'a', streamTotal: atLoad(0.3) }] });
    await add('brimmed', { service: 'search', sketch: 'heavy-queries', team: 'discovery', instances: [{ instance: 'a', streamTotal: atLoad(1.2), brimAt: new Date(Date.now() - DAY) }] });
    await add('steady', { service: 'checkout', sketch: 'steady', team: 'payments', instances: [{ instance: 'a', streamTotal: atLoad(0.5), brimAt: new Date(Date.now() + 20 * DAY) }] });
    await add('unreachable', { service: 'ads-ranking', sketch: 'frequency-cap', team: 'ads', instances: [{ instance: 'a', level: 'unreachable', streamTotal: atLoad(0.6), lastError: 'connection refused' }] });
    await add('stale', { service: 'abuse-screen', sketch: 'signup-screen', team: 'trust', instances: [{ instance: 'a', level: 'stale' }] });
    await add('replicas', {
      service: 'api-gateway',
      sketch: 'per-key-quota',
      team: 'edge',
      instances: [
        { instance: 'gw-1', streamTotal: atLoad(0.4) },
        { instance: 'gw-2', streamTotal: atLoad(0.9), brimAt: new Date(Date.now() + 3 * DAY) },
      ],
    });
  });
  afterAll(() => w.close());

  const list = (query = '') => as(w.app, viewer).get(`/api/v1/sketches${query}`);

  it('when a viewer lists the fleet, then every sketch comes worst first: brimmed, unreachable, stale, watch, then clear by load', async () => {
    const res = await list();
    expect(res.status).toBe(200);
    expect(res.body.items.map((i: { id: number }) => i.id)).toEqual([ids.brimmed, ids.unreachable, ids.stale, ids.replicas, ids.steady, ids.calm]);
    expect(res.body.items.map((i: { level: string }) => i.level)).toEqual(['brimmed', 'unreachable', 'stale', 'watch', 'clear', 'clear']);
    expect(res.body.total).toBe(6);
  });

  it('when a sketch has two replicas, then its row carries the worst instance figures and counts both instances', async () => {
    const row = (await list('?service=api-gateway')).body.items[0];
    expect(row).toMatchObject({ level: 'watch', streamTotal: atLoad(0.9), instanceCount: 2, width: 272, depth: 5, memoryBytes: 272 * 5 * 4 });
    expect(row.load).toBeCloseTo(0.9, 3);
    expect(row.capacity).toBeCloseTo(CAPACITY, 6);
  });

  it('when the fleet is summarised, then it counts levels, sketches brimming within 7 and 30 days, and the memory of every instance', async () => {
    const { summary } = (await list()).body;
    expect(summary.perLevel).toEqual({ brimmed: 1, unreachable: 1, stale: 1, watch: 1, clear: 2 });
    expect(summary.brimmingWithin7Days).toBe(1); // the gateway, in 3 days; the brimmed one is past its date
    expect(summary.brimmingWithin30Days).toBe(2); // and the steady one, in 20 days
    expect(summary.totalMemoryBytes).toBe(6 * 272 * 5 * 4); // six instances were read; the stale one never was
  });

  it('when filtered by team, level, service or a search, then only those rows come and the total follows', async () => {
    const payments = (await list('?team=payments')).body;
    expect(payments.items.map((i: { sketch: string }) => i.sketch)).toEqual(['steady', 'calm']);
    expect(payments.total).toBe(2);
    const bad = (await list('?level=brimmed,unreachable')).body;
    expect(bad.items.map((i: { id: number }) => i.id)).toEqual([ids.brimmed, ids.unreachable]);
    expect(bad.summary.perLevel.clear).toBe(2);
    expect((await list('?level=clear&level=stale')).body.total).toBe(3);
    expect((await list('?service=search')).body.items[0].sketch).toBe('heavy-queries');
    expect((await list('?q=QUOTA')).body.items.map((i: { id: number }) => i.id)).toEqual([ids.replicas]);
    expect((await list('?q=100%25')).body.total).toBe(0);
  });

  it('when sorted by a column, then rows follow it with unread sketches last', async () => {
    const byLoad = (await list('?sort=load&order=asc')).body.items.map((i: { id: number }) => i.id);
    expect(byLoad).toEqual([ids.calm, ids.steady, ids.unreachable, ids.replicas, ids.brimmed, ids.stale]);
    const byService = (await list('?sort=service')).body.items.map((i: { service: string }) => i.service);
    expect(byService).toEqual(['abuse-screen', 'ads-ranking', 'api-gateway', 'checkout', 'checkout', 'search']);
  });

  it('when paged, then each page holds pageSize rows of the same order and the total stays', async () => {
    const all = (await list()).body.items.map((i: { id: number }) => i.id);
    const second = (await list('?page=2&pageSize=4')).body;
    expect(second.items.map((i: { id: number }) => i.id)).toEqual(all.slice(4));
    expect(second).toMatchObject({ total: 6, page: 2, pageSize: 4 });
    expect((await list('?page=3&pageSize=4')).body.items).toEqual([]);
  });

  it('when a query parameter is wrong, then 400 names it', async () => {
    for (const [query, field] of [
      ['?pageSize=501', 'pageSize'],
      ['?page=0', 'page'],
      ['?sort=colour', 'sort'],
      ['?order=up', 'order'],
      ['?level=fine', 'level'],
      ['?colour=blue', 'colour'],
    ]) {
      const res = await list(query);
      expect(res.status, query).toBe(400);
      expect(res.body.error.field, query).toBe(field);
    }
  });

  it('when nobody is signed in, then 401', async () => {
    const { default: request } = await import('supertest');
    expect((await request(w.app).get('/api/v1/sketches')).status).toBe(401);
  });

  it('when a sketch is registered or deleted through the API, then the very next list shows it', async () => {
    const sre = await w.tokenFor('sre');
    expect((await list()).body.total).toBe(6);
    const created = await as(w.app, sre).post('/api/v1/sketches').send({ service: 'search', sketch: 'fresh', team: 'discovery', targetUrl: 'http://127.0.0.1:9601/m', errorBudget: 5, confidence: 0.9 });
    expect(created.status).toBe(201);
    expect((await list('?q=fresh')).body.items.map((i: { id: number }) => i.id)).toEqual([created.body.id]);
    expect((await as(w.app, sre).delete(`/api/v1/sketches/${created.body.id}`)).status).toBe(204);
    expect((await list()).body.total).toBe(6);
  });
});
