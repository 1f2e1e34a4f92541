import { CountMinSketch } from '../../backend/src/maths/sketch';
import { createZipfSampler, mulberry32 } from '../../backend/src/maths/random';
import { capacityOf } from '../../backend/src/maths/sizing';
import { segmentStart, totalAt } from './curves';
import type { DemoInstance, DemoSketch } from './scenario';

/**
 * One instance's real count-min sketch, fed with seeded Zipf traffic so that
 * its stream total follows the instance's curve. Each catch-up spreads the
 * missing increments over at most `maxDraws` keys (a busy key gets a larger
 * count), which keeps the demo's CPU use small however fast the total grows.
 */
export class FedSketch {
  readonly sketch: CountMinSketch;
  readonly capacity: number;
  private readonly nextKey: () => number;
  private readonly random: () => number;
  private segment = -Infinity;

  constructor(
    readonly spec: DemoSketch,
    readonly instance: DemoInstance,
    private readonly anchor: number,
    seed: number,
  ) {
    // Replicas of one service share their hash seeds, as replicas of one build would.
    this.sketch = new CountMinSketch({ width: spec.width, depth: spec.depth, conservative: spec.conservative, seed: 1 + spec.sketch.length });
    this.capacity = capacityOf(spec.width, spec.depth, spec.errorBudget, 1 - spec.confidence);
    this.random = mulberry32(seed);
    this.nextKey = createZipfSampler(spec.keys, spec.skew, this.random);
  }

  /** Brings the sketch to the curve's total at `t`: a new segment (restart or window) starts from an empty sketch. */
  feedTo(t: number, maxDraws: number): void {
    const growth = this.instance.growth;
    const segment = segmentStart(growth, t, this.anchor);
    if (segment !== this.segment) {
      this.sketch.reset();
      this.segment = segment;
    }
    const missing = totalAt(growth, this.capacity, t, this.anchor) - this.sketch.streamTotal;
    if (missing <= 0) return;
    const draws = Math.min(maxDraws, missing);
    const each = Math.floor(missing / draws);
    let rest = missing - each * draws;
    for (let i = 0; i < draws; i++) {
      const extra = rest > 0 ? 1 : 0;
      rest -= extra;
      this.sketch.update(`${this.spec.keyPrefix}-${this.nextKey()}`, each + extra);
    }
  }
}
