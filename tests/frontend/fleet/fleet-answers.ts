// Answers of GET /api/v1/sketches for the Fleet page's tests, in the server's shape.
import type { FleetItem, FleetPage } from '@brimwatch/api-types';

export function fleetItem(overrides: Partial<FleetItem> = {}): FleetItem {
  return {
    id: 7,
    service: 'checkout',
    sketch: 'card-velocity',
    team: 'payments',
    teamName: 'Payments',
    errorBudget: 1000,
    confidence: 0.99,
    watchLine: 0.8,
    leadTimeDays: 7,
    scrapeIntervalSeconds: 30,
    sizedTotal: null,
    level: 'watch',
    levelSince: '2026-12-01T08:00:00.000Z',
    streamTotal: 936_322,
    width: 2719,
    depth: 5,
    counterBytes: 4,
    windowSeconds: 0,
    conservative: false,
    load: 0.865,
    capacity: 1_082_453,
    boundNow: 865,
    missRisk: 0.0048,
    missRiskNote: null,
    relativeError: 0.000924,
    distinctEstimate: 19_617,
    saturatedRows: 0,
    trend: 'rising',
    trendReason: null,
    brimDate: '2026-12-04T09:00:00.000Z',
    brimEarliest: '2026-12-04T03:00:00.000Z',
    brimLatest: '2026-12-04T15:00:00.000Z',
    lastReadingAt: '2026-12-01T09:59:30.000Z',
    lastOkAt: '2026-12-01T09:59:30.000Z',
    lastError: null,
    memoryBytes: 54_380,
    instanceCount: 1,
    ...overrides,
  };
}

export function fleetPage(items: FleetItem[], total = items.length): FleetPage {
  return {
    items,
    total,
    page: 1,
    pageSize: 50,
    summary: {
      perLevel: { brimmed: 0, unreachable: 0, stale: 0, watch: items.length, clear: 0 },
      brimmingWithin7Days: 1,
      brimmingWithin30Days: 1,
      totalMemoryBytes: 54_380,
    },
  };
}
