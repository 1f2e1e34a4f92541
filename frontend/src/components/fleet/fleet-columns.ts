// The fleet table's columns: level first (LOOK.md), then names, then figures
// right-aligned. Each column's name is the server's sort name.
import type { QTableColumn } from 'quasar';
import type { FleetItem } from '@brimwatch/api-types';
import { formatBytes, formatCount, formatRelative, formatRisk } from '@/utils/format';
import { descendingByDefault, type FleetSortName } from './fleet-query';

type Column = QTableColumn<FleetItem> & { name: FleetSortName };

const NO_FIGURE = '—';

/** The brim date in words: a date, "no trend", or nothing to say yet. */
export function brimDateText(item: Pick<FleetItem, 'brimDate' | 'trend' | 'level' | 'load'>, now: Date): string {
  if (item.level === 'brimmed' || (item.load ?? 0) >= 1) return 'at the brim';
  if (item.brimDate) return formatRelative(item.brimDate, now);
  if (item.trend === 'none') return 'no trend';
  return NO_FIGURE;
}

export function missRiskText(item: Pick<FleetItem, 'missRisk' | 'missRiskNote' | 'load'>): string {
  if (item.missRisk === null) return item.missRiskNote ?? (item.load === null ? NO_FIGURE : formatRisk(null));
  return formatRisk(item.missRisk);
}

export function boundText(item: Pick<FleetItem, 'boundNow' | 'errorBudget'>): string {
  const bound = item.boundNow === null ? NO_FIGURE : formatCount(item.boundNow);
  return `${bound} / ${formatCount(item.errorBudget)}`;
}

/** A first click sorts the way the column reads best: figures worst first, names and brim dates A→Z / soonest. */
function firstClick(columns: Column[]): Column[] {
  return columns.map((c) => ({ ...c, sortOrder: descendingByDefault(c.name) ? 'da' : 'ad' }));
}

export function fleetColumns(now: () => Date): Column[] {
  const figure = { align: 'right' as const, sortable: true, classes: 'bw-num' };
  return firstClick([
    { name: 'level', label: 'Level', field: 'level', align: 'left', sortable: true },
    { name: 'service', label: 'Service', field: 'service', align: 'left', sortable: true },
    { name: 'sketch', label: 'Sketch', field: 'sketch', align: 'left', sortable: true },
    { name: 'team', label: 'Team', field: 'teamName', align: 'left', sortable: true },
    { name: 'load', label: 'Load', field: 'load', ...figure },
    { name: 'boundNow', label: 'Bound now / budget', field: 'boundNow', ...figure, format: (_v, row) => boundText(row) },
    { name: 'missRisk', label: 'Miss risk', field: 'missRisk', ...figure, format: (_v, row) => missRiskText(row) },
    { name: 'brimDate', label: 'Brim date', field: 'brimDate', ...figure, format: (_v, row) => brimDateText(row, now()) },
    {
      name: 'lastReadingAt',
      label: 'Last reading',
      field: 'lastReadingAt',
      ...figure,
      format: (v: string | null) => (v ? formatRelative(v, now()) : 'never'),
    },
    {
      name: 'memoryBytes',
      label: 'Memory',
      field: 'memoryBytes',
      ...figure,
      format: (v: number | null) => (v === null ? NO_FIGURE : formatBytes(v)),
    },
  ]);
}
