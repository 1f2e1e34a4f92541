import type { Assessment } from '../maths/assess';
import type { OccupancyEstimate } from '../maths/occupancy';

/** The figures one scrape read from the target, and the memory they take. */
export interface TargetReading {
  width: number;
  depth: number;
  streamTotal: number;
  nonzeroCells: number[];
  counterBytes: number;
  windowSeconds: number;
  conservative: boolean;
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
