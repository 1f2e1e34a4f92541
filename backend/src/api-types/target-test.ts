import type { Assessment } from '../maths/assess';
import type { OccupancyEstimate } from '../maths/occupancy';

/** What one scrape tells about one sketch: the figures the exposition carries, checked. */
export interface SketchSample {
  width: number;
  depth: number;
  /** n: the service's own count of increments (since start, or since the window began). */
  streamTotal: number;
  /** Non-zero counters of row 0 … depth − 1, in row order. */
  nonzeroCells: number[];
  counterBytes: number;
  /** 0 for a cumulative sketch, else the reset period. */
  windowSeconds: number;
  conservative: boolean;
}

/** The figures one scrape read from the target, and the memory they take. */
export interface TargetReading extends SketchSample {
  memoryBytes: number;
}

/** POST /api/v1/sketches/test-target: what Brimwatch reads at the address, or exactly why it could not. */
export type TargetTest =
  | {
      ok: true;
      targetUrl: string;
      sketch: string;
      reading: TargetReading;
      occupancy: OccupancyEstimate;
      /** Null unless the request gave an error budget and a confidence. */
      assessment: Assessment | null;
      scrapeMs: number;
    }
  | {
      ok: false;
      targetUrl: string;
      sketch: string;
      /** One of the collectors' few failure kinds ('timeout', 'parse error', …); the reason carries the detail. */
      kind: string;
      reason: string;
      scrapeMs: number;
    };
