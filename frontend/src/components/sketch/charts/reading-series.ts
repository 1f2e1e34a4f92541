// Turns the readings API's buckets into the columns the charts draw, with the
// capacity in force at each point and the miss risk it implies.
import type { HistoryMarker, SketchDetail, SketchHistory } from '@brimwatch/api-types';
import { riskFromLoad } from './risk-from-load';

export interface ChartMarker {
  /** Seconds since 1970, uPlot's time unit. */
  x: number;
  kind: HistoryMarker['kind'];
  label: string;
}

export interface ReadingSeries {
  xs: number[];
  totals: (number | null)[];
  /** Capacity at each point: total ÷ load of the same bucket, so resizes show as steps. */
  capacities: (number | null)[];
  loadPercents: (number | null)[];
  risks: (number | null)[];
  /** One column per row (row 0 first): its occupancy in percent at each point, null where a point has none or fewer rows. */
  occupancyPercents: (number | null)[][];
  markers: ChartMarker[];
  fromX: number;
  toX: number;
  /** True when a resize in the range leaves the depth before it unknown, so early risks are left out. */
  depthUnknownBefore: number | null;
}

const seconds = (iso: string) => new Date(iso).getTime() / 1000;

function markerLabel(m: HistoryMarker): string {
  if (m.kind === 'reset') return 'reset';
  return m.width !== null && m.depth !== null ? `resize ${m.width}×${m.depth}` : 'resize';
}

/** The depth in force at each time: the last resize's, or the sketch's own when no resize lies in the range. */
function depthAt(x: number, resizes: HistoryMarker[], currentDepth: number | null): number | null {
  let depth: number | null = resizes.length ? null : currentDepth;
  for (const r of resizes) if (seconds(r.t) <= x) depth = r.depth;
  return depth;
}

export function readingSeries(history: SketchHistory, detail: Pick<SketchDetail, 'confidence' | 'depth' | 'capacity'>): ReadingSeries {
  const delta = 1 - detail.confidence;
  const resizes = history.markers.filter((m) => m.kind === 'resize');
  const xs = history.points.map((p) => seconds(p.t));
  let lastCapacity: number | null = null;
  const capacities = history.points.map((p) => {
    if (p.totalMax !== null && p.loadMax !== null && p.loadMax > 0) lastCapacity = p.totalMax / p.loadMax;
    return lastCapacity;
  });
  // Points before the first load carry the first capacity seen, or the sketch's current one.
  const firstKnown = capacities.find((c) => c !== null) ?? detail.capacity;
  return {
    xs,
    totals: history.points.map((p) => p.totalMax),
    capacities: capacities.map((c) => c ?? firstKnown),
    loadPercents: history.points.map((p) => (p.loadMax === null ? null : p.loadMax * 100)),
    risks: history.points.map((p, i) => riskFromLoad(p.loadMax, delta, depthAt(xs[i], resizes, detail.depth) ?? 0)),
    occupancyPercents: occupancyColumns(history),
    markers: history.markers.map((m) => ({ x: seconds(m.t), kind: m.kind, label: markerLabel(m) })),
    fromX: seconds(history.from),
    toX: seconds(history.to),
    depthUnknownBefore: resizes.length ? seconds(resizes[0].t) : null,
  };
}

/** Rows as columns: as many as the deepest point has, so a resize to more rows starts new lines there. */
function occupancyColumns(history: SketchHistory): (number | null)[][] {
  const depth = Math.max(0, ...history.points.map((p) => p.occupancy?.length ?? 0));
  return Array.from({ length: depth }, (_, row) => history.points.map((p) => (p.occupancy && row < p.occupancy.length ? p.occupancy[row] * 100 : null)));
}
