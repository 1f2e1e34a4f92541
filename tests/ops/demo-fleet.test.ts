import { afterAll, describe, expect, it } from 'vitest';
import { scrapeOnce } from '../../collectors/scrape-once';
import { sketchVerdicts } from '../../collectors/sketch-level';
import type { HealthLevel } from '../../backend/src/maths/health-levels';
import { backfillTarget } from '../../ops/demo-fleet/backfill';
import { segmentStart, totalAt } from '../../ops/demo-fleet/curves';
import { FedSketch } from '../../ops/demo-fleet/fed-sketch';
import { startInstanceServer, type InstanceServer } from '../../ops/demo-fleet/instance-server';
import { DEMO_SKETCHES, type Behaviour } from '../../ops/demo-fleet/scenario';

const HOUR = 3_600_000;
const anchor = Date.parse('2026-12-01T12:20:00Z');
const terms = (spec: (typeof DEMO_SKETCHES)[number]) => ({ errorBudget: spec.errorBudget, confidence: spec.confidence, watchLine: 0.8, leadTimeDays: 7 });

describe('the demo fleet', () => {
  it('when a replica restarts or a window ends, then its total falls to zero; in between it only grows', () => {
    const restarts = { kind: 'restarts' as const, peakLoadWeekAgo: 0.5, peakLoadNow: 1, periodHours: 24, lastRestartHoursAgo: 2 };
    const restartAt = anchor - 2 * HOUR;
    expect(segmentStart(restarts, anchor, anchor)).toBe(restartAt);
    expect(totalAt(restarts, 1000, restartAt, anchor)).toBe(0);
    expect(totalAt(restarts, 1000, restartAt - 1, anchor)).toBeGreaterThan(900);
    const windowed = { kind: 'windowed' as const, peakLoadWeekAgo: 1, peakLoadNow: 1, windowSeconds: 3600 };
    const hourStart = Date.parse('2026-12-01T12:00:00Z');
    expect(totalAt(windowed, 3600, hourStart + 30 * 60_000, anchor)).toBe(1800);
    const series = Array.from({ length: 50 }, (_, i) => totalAt({ kind: 'cumulative', loadWeekAgo: 0.2, loadNow: 0.4 }, 1e6, anchor - i * HOUR, anchor));
    expect(series.every((v, i) => i === 0 || v <= series[i - 1])).toBe(true);
  });

  it("when the back-filled week is judged by the collector's own code, then the sketches start at every level", () => {
    const levels = new Map<string, HealthLevel>();
    for (const [s, spec] of DEMO_SKETCHES.entries()) {
      const statuses = spec.instances.map((instance, i) => {
        const target = { targetId: i + 1, sketchId: s + 1, url: '', instance: instance.name, sketchLabel: spec.sketch, intervalSeconds: spec.scrapeIntervalSeconds, dueAt: new Date(anchor), ...terms(spec) };
        const { status } = backfillTarget(spec, instance, target, anchor, 11 + s * 10 + i);
        return { sketch_id: s + 1, level: status.level as HealthLevel, judgement: status.judgement ? JSON.parse(status.judgement as string) : null, taken_at: null };
      });
      levels.set(spec.sketch, sketchVerdicts(statuses, new Date(anchor))[0].level);
    }
    expect(Object.fromEntries(levels)).toEqual({
      'per-card-limiter': 'watch',
      'heavy-query-detector': 'clear',
      'frequency-cap': 'brimmed',
      'per-key-quota': 'watch',
      'message-screen': 'clear',
      'signup-screen': 'stale',
      'per-ip-burst': 'unreachable',
    });
  }, 120_000);

  describe('its instances on loopback', () => {
    const servers: InstanceServer[] = [];
    afterAll(() => Promise.all(servers.map((s) => s.close())));
    const settings = { allowlist: '127.0.0.0/8', maxBytes: 1 << 20, intervalSeconds: 2 };
    const start = async (sketch: string, behaviour: Behaviour) => {
      const spec = DEMO_SKETCHES.find((s) => s.sketch === sketch)!;
      const fed = new FedSketch(spec, spec.instances[0], Date.now(), 3);
      fed.feedTo(Date.now(), 2000);
      const server = await startInstanceServer(0, [fed], behaviour, Date.now());
      servers.push(server);
      return { fed, url: `http://127.0.0.1:${server.port}/metrics` };
    };

    it('when an instance answers, then the collector reads its real sketch: width, depth, total and occupancy', async () => {
      const { fed, url } = await start('frequency-cap', { kind: 'answers' });
      const result = await scrapeOnce(url, 'frequency-cap', settings);
      expect(result).toMatchObject({
        ok: true,
        sample: { width: 2719, depth: 3, streamTotal: fed.sketch.streamTotal, nonzeroCells: fed.sketch.nonzeroCells(), windowSeconds: 3600, conservative: false },
      });
      expect(fed.sketch.streamTotal).toBeGreaterThan(0);
    });

    it('when an instance answers garbage, hangs, or stops after a while, then the collector says why', async () => {
      const garbage = await start('per-ip-burst', { kind: 'garbage' });
      expect(await scrapeOnce(garbage.url, 'per-ip-burst', settings)).toMatchObject({ ok: false, kind: 'parse error' });
      const hung = await start('signup-screen', { kind: 'hangs' });
      expect(await scrapeOnce(hung.url, 'signup-screen', settings)).toMatchObject({ ok: false, kind: 'timeout' });
      const stopping = await start('message-screen', { kind: 'stops', afterSeconds: 1 });
      expect(await scrapeOnce(stopping.url, 'message-screen', settings)).toMatchObject({ ok: true });
      await new Promise((r) => setTimeout(r, 1100));
      expect(await scrapeOnce(stopping.url, 'message-screen', settings)).toMatchObject({ ok: false, kind: 'timeout' });
    });
  });
});
