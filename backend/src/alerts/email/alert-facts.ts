import type { SketchDetail } from '../../api-types';
import { formatPercent } from '../../maths/format';
import { CAUTION } from './levels';
import { formatBytes, formatCount, formatLoad, formatRisk, formatWhen } from './figures';
import type { MailRow, MailSection } from './document';

/** What an alert message says about the sketch: the sketch page's own figures (its worst instance) and resize plan. */
export type AlertFacts = Pick<
  SketchDetail,
  | 'id' | 'service' | 'sketch' | 'teamName' | 'errorBudget' | 'confidence' | 'watchLine' | 'level' | 'load' | 'capacity' | 'boundNow'
  | 'missRisk' | 'streamTotal' | 'brimDate' | 'brimEarliest' | 'brimLatest' | 'trend' | 'trendReason' | 'width' | 'depth'
  | 'counterBytes' | 'memoryBytes' | 'lastError' | 'lastOkAt' | 'resizePlan'
> & { instanceCount: number };

export { CAUTION };

export function brimText(f: AlertFacts): string {
  if (f.load !== null && f.load >= 1) return f.brimDate ? `reached ${formatWhen(f.brimDate)}` : 'reached: the load is at or over capacity';
  if (f.brimDate) {
    const [at, earliest] = [formatWhen(f.brimDate), formatWhen(f.brimEarliest)];
    const latest = f.brimLatest ? formatWhen(f.brimLatest) : 'no later bound (the slow edge of the trend does not rise)';
    if (earliest === at && latest === at) return `${at} (the trend's range agrees to the minute)`;
    return `${at} (between ${earliest} and ${latest})`;
  }
  if (f.trend === 'none') return `no trend${f.trendReason ? `: ${f.trendReason}` : ''}`;
  return '—';
}

/** The figures block: where the sketch stands now against its budget. */
export function figureRows(f: AlertFacts): MailRow[] {
  const instances = f.instanceCount === 1 ? '1 instance' : `${f.instanceCount} instances; figures of the fullest`;
  const rows: MailRow[] = [
    { label: 'Team', value: f.teamName },
    { label: 'Service', value: f.service },
    { label: 'Sketch', value: `${f.sketch} (${instances})` },
  ];
  if (f.load === null || f.capacity === null) {
    rows.push({ label: 'Load', value: 'no good reading yet' });
  } else {
    rows.push(
      { label: 'Load', value: `${formatLoad(f.load)} of capacity (stream total ${formatCount(f.streamTotal ?? 0)}, capacity ${formatCount(f.capacity)})`, figure: true },
      { label: 'Bound now', value: `${formatCount(f.boundNow ?? 0)} vs error budget ${formatCount(f.errorBudget)}, at ${formatPercent(f.confidence)} confidence`, figure: true },
      { label: 'Miss risk', value: `${formatRisk(f.missRisk)} per queried key (chance of an overcount above the budget)`, figure: true },
      { label: 'Brim date', value: brimText(f), figure: true },
    );
  }
  if (f.width && f.depth) {
    rows.push({ label: 'Size now', value: `width ${formatCount(f.width)} × depth ${f.depth}, ${formatBytes(f.memoryBytes ?? 0)} per instance`, figure: true });
  }
  if (f.lastError) rows.push({ label: 'Last error', value: f.lastError });
  if (f.level === 'stale' || f.level === 'unreachable') rows.push({ label: 'Last good reading', value: formatWhen(f.lastOkAt) });
  return rows;
}

/** The resize plan block, from the maths module's plan for the trend's total in 90 days plus headroom. */
export function resizeSection(f: AlertFacts): MailSection {
  const p = f.resizePlan;
  if (!p) return { title: 'Resize plan', paragraphs: ['No resize plan yet: it needs a good reading that carries the width, depth and counter size.'] };
  const change = `${p.memoryChangeBytes >= 0 ? '+' : ''}${formatBytes(p.memoryChangeBytes)}`;
  const rows: MailRow[] = p.resizeNeeded
    ? [
        { label: 'New size', value: `width ${formatCount(p.width)} × depth ${p.depth} (now ${formatCount(p.widthBefore)} × ${p.depthBefore})`, figure: true },
        { label: 'Memory', value: `${formatBytes(p.memoryBytesBefore)} → ${formatBytes(p.memoryBytes)} (${change}) per instance`, figure: true },
        { label: 'Holds up to', value: `${formatCount(p.capacity)} (now ${formatCount(p.capacityBefore)})`, figure: true },
      ]
    : [{ label: 'New size', value: `none needed: width ${formatCount(p.widthBefore)} × depth ${p.depthBefore} holds the forecast`, figure: true }];
  rows.push({ label: 'Sized for', value: `${formatCount(p.targetTotal)} (the trend's total in ${p.horizonDays} days plus ${formatPercent(p.headroom - 1)} headroom)`, figure: true });
  return { title: 'Resize plan', rows, paragraphs: [p.reason] };
}
