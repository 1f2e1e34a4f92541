import type { TotalReading } from '../backend/src/maths';

interface Entry {
  /** The newest reading's time: the entry holds while the target's last good reading (target_status.last_ok_at) is this one. */
  lastOkAt: number;
  /** t0, total0, t1, total1, … oldest first: a tenth of the memory of reading objects. */
  points: Float64Array;
}

/**
 * The forecast history of the targets this process stored last, so that the
 * next scrape of the same target reads no history from the database (in
 * steady state, that read was the largest part of storing a batch). An entry
 * is used only while the target's last good reading is still the one it ends
 * with: a reading stored meanwhile by another collector makes it stale and
 * the history is read again. It holds the same readings the database would
 * give: the latest `limit` good ones of the current sizing epoch. At most
 * `maxTargets` entries, the least recently stored dropped first.
 */
export class HistoryCache {
  private readonly entries = new Map<number, Entry>();

  constructor(
    private readonly limit: number,
    private readonly maxTargets = 20_000,
  ) {}

  recall(targetId: number, lastOkAt: Date | null | undefined): TotalReading[] | undefined {
    const entry = this.entries.get(targetId);
    if (!entry || !lastOkAt || lastOkAt.getTime() !== entry.lastOkAt) return undefined;
    const points: TotalReading[] = [];
    for (let i = 0; i < entry.points.length; i += 2) points.push({ t: entry.points[i], total: entry.points[i + 1] });
    return points;
  }

  /** Once the reading is stored: it joins the history it was judged on, or starts a new one at a resize. */
  remember(targetId: number, before: readonly TotalReading[], reading: TotalReading, resize: boolean): void {
    const kept = resize ? [reading] : [...before, reading].slice(-this.limit);
    const points = new Float64Array(kept.length * 2);
    kept.forEach((p, i) => {
      points[2 * i] = p.t;
      points[2 * i + 1] = p.total;
    });
    this.entries.delete(targetId);
    this.entries.set(targetId, { lastOkAt: reading.t, points });
    if (this.entries.size > this.maxTargets) this.entries.delete(this.entries.keys().next().value as number);
  }

  get size(): number {
    return this.entries.size;
  }
}
