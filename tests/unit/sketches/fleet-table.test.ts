import { describe, expect, it } from 'vitest';
import type { FleetRow } from '../../../backend/src/queries/fleet';
import { selectFleet, type FleetQuery } from '../../../backend/src/services/sketches/fleet-table';

const NOW = new Date('2026-12-01T12:00:00Z');
const DAY = 86_400_000;
const SEVERITY: Record<string, number> = { clear: 0, watch: 1, stale: 2, unreachable: 3, brimmed: 4 };

function row(id: number, over: Partial<FleetRow>): FleetRow {
  const level = over.level ?? 'clear';
  return {
    id, sketch: `sketch-${id}`, service: 'checkout', team: 'payments', team_name: 'Payments', error_budget: 100, confidence: 0.99,
    watch_line: 0.8, lead_time_days: 7, scrape_interval_seconds: 30, sized_total: null, target_id: id, level, severity: SEVERITY[level],
    taken_at: NOW.getTime(), stream_total: 1000, width: 272, depth: 5, load: 0.5, capacity: 2000, bound_now: 50, miss_risk: 0.01,
    brim_date: null, memory_bytes: 5440, instances: 1, all_memory: 5440, ...over,
  };
}

const query = (over: Partial<FleetQuery> = {}): FleetQuery => ({ teams: [], services: [], levels: [], q: undefined, sort: 'level', order: 'desc', page: 1, pageSize: 50, now: NOW, ...over });

const fleet = [
  row(1, { level: 'clear', load: 0.3 }),
  row(2, { level: 'brimmed', load: 1.2, team: 'discovery', service: 'search' }),
  row(3, { level: 'clear', load: 0.6, brim_date: NOW.getTime() + 20 * DAY }),
  row(4, { level: 'stale', load: null, stream_total: null, memory_bytes: null, all_memory: 0, target_id: null }),
  row(5, { level: 'watch', load: 0.9, brim_date: NOW.getTime() + 3 * DAY, instances: 2, all_memory: 10_880, service: 'api-gateway', team: 'edge', team_name: 'Edge Platform' }),
  row(6, { level: 'brimmed', load: 1.5, brim_date: NOW.getTime() - DAY }),
];
const ids = (rows: FleetRow[]) => rows.map((r) => r.id);

describe('the fleet table', () => {
  it('when nothing is asked, then worst level first, higher load first within a level', () => {
    expect(ids(selectFleet(fleet, query()).page)).toEqual([6, 2, 4, 5, 3, 1]);
  });

  it('when sorted by a figure, then missing figures come last either way', () => {
    expect(ids(selectFleet(fleet, query({ sort: 'load', order: 'asc' })).page)).toEqual([1, 3, 5, 2, 6, 4]);
    expect(ids(selectFleet(fleet, query({ sort: 'load', order: 'desc' })).page)).toEqual([6, 2, 5, 3, 1, 4]);
    expect(ids(selectFleet(fleet, query({ sort: 'brimDate', order: 'asc' })).page)).toEqual([6, 5, 3, 2, 4, 1]);
  });

  it('when summarised, then the level filter is ignored but the others count', () => {
    const { summary, total } = selectFleet(fleet, query({ levels: ['brimmed'] }));
    expect(total).toBe(2);
    expect(summary).toEqual({
      perLevel: { brimmed: 2, unreachable: 0, stale: 1, watch: 1, clear: 2 },
      brimmingWithin7Days: 1, // sketch 5; sketch 6 brimmed already
      brimmingWithin30Days: 2, // and sketch 3
      totalMemoryBytes: 5440 * 4 + 10_880,
    });
    expect(selectFleet(fleet, query({ teams: ['edge'] })).summary.totalMemoryBytes).toBe(10_880);
  });

  it('when searched, then service, sketch, team and team name match regardless of case', () => {
    expect(ids(selectFleet(fleet, query({ q: 'EDGE plat' })).page)).toEqual([5]);
    expect(ids(selectFleet(fleet, query({ q: 'sketch-4' })).page)).toEqual([4]);
    expect(selectFleet(fleet, query({ q: '%' })).total).toBe(0);
  });

  it('when paged, then pages follow the same order and the total counts every match', () => {
    const second = selectFleet(fleet, query({ page: 2, pageSize: 4 }));
    expect(ids(second.page)).toEqual([3, 1]);
    expect(second.total).toBe(6);
  });
});
