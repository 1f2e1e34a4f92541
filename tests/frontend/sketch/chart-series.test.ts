import { describe, expect, it } from 'vitest';
import { assess } from '@brimwatch/maths';
import { riskFromLoad } from '@/components/sketch/charts/risk-from-load';
import { readingSeries } from '@/components/sketch/charts/reading-series';
import { chartEndX, forecastShape } from '@/components/sketch/charts/brim-forecast';
import type { SketchHistory } from '@brimwatch/api-types';

const HOUR = 3_600_000;
const T0 = Date.parse('2026-11-25T00:00:00Z');
const iso = (ms: number) => new Date(ms).toISOString();

function history(points: [number, number | null, number | null][], markers: SketchHistory['markers'] = []): SketchHistory {
  return {
    sketchId: 7,
    instance: null,
    from: iso(T0),
    to: iso(T0 + 24 * HOUR),
    bucketSeconds: 3600,
    points: points.map(([hour, total, load]) => ({ t: iso(T0 + hour * HOUR), totalMin: total, totalMax: total, totalLast: total, loadMax: load, level: 'clear', occupancy: null, readings: 1, failures: 0 })),
    markers,
  };
}

describe('miss risk from a recorded load', () => {
  it('when m = 272, k = 5, E = 10 000, δ = 0.01 and n = 1 000 000, then the risk is (n/(m·E))^5 = 6.72 × 10⁻³', () => {
    // By hand: n/(m·E) = 1 000 000 / 2 720 000 = 0.367647…; 0.367647^5 = 0.0067167 (DESIGN.md's Markov bound over k rows).
    // Capacity m·E·δ^(1/k) = 2 720 000 × 0.398107 = 1 082 851.5, so the load is 0.923488.
    expect(riskFromLoad(1_000_000 / 1_082_851.5039, 0.01, 5)).toBeCloseTo(0.0067167, 6);
  });

  it('when the load is exactly 1, then the risk equals δ, which is why the brim is drawn at δ', () => {
    expect(riskFromLoad(1, 0.001, 7)).toBeCloseTo(0.001, 12);
  });

  it('when the total passes m·E, then the bound says nothing and the risk is drawn at 1', () => {
    // n = 3 000 000 > m·E = 2 720 000 for the sketch above: load 2.77, load·δ^(1/k) = 1.10 ≥ 1.
    expect(riskFromLoad(3_000_000 / 1_082_851.5039, 0.01, 5)).toBe(1);
    expect(assess({ width: 272, depth: 5, errorBudget: 10_000, confidence: 0.99, streamTotal: 3_000_000 }).missRisk).toBeNull();
  });

  it('when the load is zero or unknown, then there is no point a log scale could show', () => {
    expect(riskFromLoad(0, 0.01, 5)).toBeNull();
    expect(riskFromLoad(null, 0.01, 5)).toBeNull();
  });
});

describe('the chart columns from the readings', () => {
  it('when total and load are known, then the capacity at each point is their ratio, so a resize shows as a step', () => {
    const series = readingSeries(
      history([[0, 500_000, 0.5], [1, null, null], [2, 600_000, 0.3]], [{ t: iso(T0 + 1.5 * HOUR), kind: 'resize', instance: 'a', width: 2719, depth: 5 }]),
      { confidence: 0.99, depth: 5, capacity: 2_000_000 },
    );
    expect(series.capacities).toEqual([1_000_000, 1_000_000, 2_000_000]);
    expect(series.loadPercents).toEqual([50, null, 30]);
    expect(series.markers).toEqual([{ x: (T0 + 1.5 * HOUR) / 1000, kind: 'resize', label: 'resize 2719×5' }]);
    // Before the resize the depth is not known here, so no risk is drawn there; after it, δ·load^k = 0.01 × 0.3^5.
    expect(series.risks[0]).toBeNull();
    expect(series.risks[2]).toBeCloseTo(0.01 * 0.3 ** 5, 12);
    expect(series.depthUnknownBefore).toBe((T0 + 1.5 * HOUR) / 1000);
  });

  it('when the brim date lies within the chart\'s reach, then the dashed line runs from the last reading to the brim', () => {
    const series = readingSeries(history([[0, 400_000, 0.4], [23, 800_000, 0.8]]), { confidence: 0.99, depth: 5, capacity: 1_000_000 });
    const brimAt = T0 + 33 * HOUR;
    const shape = forecastShape({ brimDate: iso(brimAt), brimEarliest: iso(brimAt - 2 * HOUR), brimLatest: iso(brimAt + 3 * HOUR), capacity: 1_000_000, load: 0.8 }, series);
    expect(shape).toMatchObject({ startX: (T0 + 23 * HOUR) / 1000, startTotal: 800_000, endX: brimAt / 1000, endTotal: 1_000_000, beyondView: false });
    expect(chartEndX(series, shape)).toBeGreaterThanOrEqual((brimAt + 3 * HOUR) / 1000);
  });

  it('when the brim date lies beyond twice the range, then the line stops at the edge on its way up, at the height the trend gives there', () => {
    const series = readingSeries(history([[0, 400_000, 0.4], [24, 500_000, 0.5]]), { confidence: 0.99, depth: 5, capacity: 1_000_000 });
    // From 500 000 at hour 24 to 1 000 000 at hour 124: at the edge (hour 48) the line is at 500 000 + 24 × 5 000 = 620 000.
    const shape = forecastShape({ brimDate: iso(T0 + 124 * HOUR), brimEarliest: null, brimLatest: null, capacity: 1_000_000, load: 0.5 }, series);
    expect(shape?.beyondView).toBe(true);
    expect(shape?.endX).toBe((T0 + 48 * HOUR) / 1000);
    expect(shape?.endTotal).toBeCloseTo(620_000, 6);
  });

  it('when the sketch is already over its brim, then no forecast is drawn', () => {
    const series = readingSeries(history([[0, 1_200_000, 1.2]]), { confidence: 0.99, depth: 5, capacity: 1_000_000 });
    expect(forecastShape({ brimDate: iso(T0), brimEarliest: null, brimLatest: null, capacity: 1_000_000, load: 1.2 }, series)).toBeNull();
  });
});

describe('row occupancy as chart columns', () => {
  it('when a sketch is resized from 2 rows to 3, then each row is a column in percent and the new row starts at the resize', () => {
    const h = history([
      [0, 100, 0.1],
      [1, 200, 0.2],
      [2, 300, 0.3],
    ]);
    h.points[0].occupancy = [0.25, 0.5];
    h.points[1].occupancy = null;
    h.points[2].occupancy = [0.1, 0.2, 0.3];
    const s = readingSeries(h, { confidence: 0.99, depth: 3, capacity: 1000 });
    expect(s.occupancyPercents).toHaveLength(3);
    expect(s.occupancyPercents[0]).toEqual([25, null, 10]);
    expect(s.occupancyPercents[1]).toEqual([50, null, 20]);
    expect(s.occupancyPercents[2]).toEqual([null, null, 30]);
  });
});
