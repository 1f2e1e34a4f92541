import type { FleetRow } from '../../queries/fleet';

export interface FleetSnapshot {
  rows(): Promise<FleetRow[]>;
  /** After a change made through this server, the next read goes to the database. */
  invalidate(): void;
}

/** A snapshot up to this many times its fresh age is still served while a newer one is read. */
const STALE_FACTOR = 5;

/**
 * The fleet table reads every sketch's worst instance; with thousands of
 * sketches that is the costliest query of the API, and the figures change only
 * once per scrape interval. So one read serves every request for `maxAgeMs`;
 * a little older, it is still served while the next read runs in the
 * background; older still (or invalidated), the request waits for a fresh read.
 */
export function fleetSnapshot(readRows: () => Promise<FleetRow[]>, maxAgeMs: number, log: (line: string) => void = console.error): FleetSnapshot {
  let held: { rows: FleetRow[]; at: number } | undefined;
  let reading: Promise<FleetRow[]> | undefined;
  let generation = 0;

  const read = (): Promise<FleetRow[]> => {
    if (reading) return reading;
    const started = Date.now();
    const mine = generation;
    const pending = readRows()
      .then((rows) => {
        if (mine === generation) held = { rows, at: started };
        return rows;
      })
      .finally(() => {
        if (reading === pending) reading = undefined;
      });
    reading = pending;
    return pending;
  };

  return {
    async rows() {
      const age = held && maxAgeMs > 0 ? Date.now() - held.at : Infinity;
      if (held && age <= maxAgeMs) return held.rows;
      if (held && age <= maxAgeMs * STALE_FACTOR) {
        read().catch((err) => log(`[web] the fleet snapshot was not refreshed: ${err instanceof Error ? err.message : String(err)}`));
        return held.rows;
      }
      return read();
    },
    invalidate() {
      generation++;
      held = undefined;
      reading = undefined;
    },
  };
}
