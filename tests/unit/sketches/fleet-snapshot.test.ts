import { afterEach, describe, expect, it, vi } from 'vitest';
import type { FleetRow } from '../../../backend/src/queries/fleet';
import { fleetSnapshot } from '../../../backend/src/services/sketches/fleet-snapshot';

const rowsNamed = (name: string) => [{ id: 1, sketch: name } as FleetRow];

describe('the fleet snapshot', () => {
  afterEach(() => vi.useRealTimers());

  it('when read again within its fresh age, then the database is not asked again', async () => {
    vi.useFakeTimers();
    const read = vi.fn(async () => rowsNamed('a'));
    const snapshot = fleetSnapshot(read, 2000);
    await snapshot.rows();
    vi.advanceTimersByTime(1500);
    await snapshot.rows();
    expect(read).toHaveBeenCalledTimes(1);
  });

  it('when a little older, then the old rows are served at once while a newer read runs', async () => {
    vi.useFakeTimers();
    let version = 0;
    const snapshot = fleetSnapshot(async () => rowsNamed(`v${++version}`), 2000);
    await snapshot.rows();
    vi.advanceTimersByTime(3000);
    expect((await snapshot.rows())[0].sketch).toBe('v1');
    await vi.waitFor(async () => expect((await snapshot.rows())[0].sketch).toBe('v2'));
  });

  it('when much older, invalidated, or the fresh age is 0, then the request waits for a new read', async () => {
    vi.useFakeTimers();
    let version = 0;
    const snapshot = fleetSnapshot(async () => rowsNamed(`v${++version}`), 2000);
    await snapshot.rows();
    vi.advanceTimersByTime(20_000);
    expect((await snapshot.rows())[0].sketch).toBe('v2');
    snapshot.invalidate();
    expect((await snapshot.rows())[0].sketch).toBe('v3');
    const always = fleetSnapshot(async () => rowsNamed(`w${++version}`), 0);
    const first = (await always.rows())[0].sketch;
    expect((await always.rows())[0].sketch).not.toBe(first);
  });

  it('when many requests arrive during one read, then they share it', async () => {
    let release: (rows: FleetRow[]) => void = () => {};
    const read = vi.fn(() => new Promise<FleetRow[]>((resolve) => (release = resolve)));
    const snapshot = fleetSnapshot(read, 2000);
    const waiting = Promise.all([snapshot.rows(), snapshot.rows(), snapshot.rows()]);
    release(rowsNamed('shared'));
    expect((await waiting).map((r) => r[0].sketch)).toEqual(['shared', 'shared', 'shared']);
    expect(read).toHaveBeenCalledTimes(1);
  });

  it('when a change invalidates the snapshot during a read, then that older read is not kept', async () => {
    const releases: ((rows: FleetRow[]) => void)[] = [];
    const snapshot = fleetSnapshot(() => new Promise<FleetRow[]>((resolve) => releases.push(resolve)), 60_000);
    const before = snapshot.rows();
    snapshot.invalidate();
    const after = snapshot.rows();
    releases[0](rowsNamed('before the change'));
    releases[1](rowsNamed('after the change'));
    expect((await before)[0].sketch).toBe('before the change');
    expect((await after)[0].sketch).toBe('after the change');
    expect((await snapshot.rows())[0].sketch).toBe('after the change');
  });
});
