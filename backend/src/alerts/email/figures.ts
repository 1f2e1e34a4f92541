import { formatBytes, formatCount } from '../../maths/format';

/**
 * How e-mail writes figures. Counts and memory use the maths module's
 * formatting, so the resize plan's own sentence and the figures around it
 * agree; risks and loads follow LOOK.md.
 */
export { formatBytes, formatCount };

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', 0: '⁰', 1: '¹', 2: '²', 3: '³', 4: '⁴', 5: '⁵', 6: '⁶', 7: '⁷', 8: '⁸', 9: '⁹' };

/** A probability as "2.9 × 10⁻⁴" below 0.1, two decimals above; null is the Markov bound saying nothing. */
export function formatRisk(probability: number | null): string {
  if (probability === null) return 'no guarantee (the bound says nothing at this total)';
  if (!Number.isFinite(probability) || probability < 0) return '—';
  if (probability === 0) return '0';
  if (probability >= 1) return '1';
  if (probability >= 0.1) return probability.toFixed(2) === '1.00' ? '> 0.99' : probability.toFixed(2);
  const [mantissa, exponent] = probability.toExponential(1).split('e');
  return `${mantissa} × 10${[...String(Number(exponent))].map((c) => SUPERSCRIPT[c]).join('')}`;
}

/** A load as a whole percentage, rounded down so "100 %" appears only once the budget no longer holds. */
export function formatLoad(fraction: number | null): string {
  if (fraction === null || !Number.isFinite(fraction) || fraction < 0) return '—';
  if (fraction > 0 && fraction < 0.01) return '< 1 %';
  return `${formatCount(Math.floor(fraction * 100 + 1e-9))} %`;
}

/** A moment in UTC, to the minute: mail is read in many time zones and sorts by this. */
export function formatWhen(value: Date | string | null): string {
  if (value === null) return '—';
  const date = new Date(value);
  if (Number.isNaN(date.getTime())) return '—';
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

export function formatDay(value: Date | string): string {
  return new Date(value).toISOString().slice(0, 10);
}

/** "4 h", "30 min", "2 days": how long something has lasted. */
export function formatSpan(ms: number): string {
  const minutes = Math.round(ms / 60_000);
  if (minutes < 90) return `${minutes} min`;
  const hours = Math.round(minutes / 60);
  if (hours < 48) return `${hours} h`;
  return `${Math.round(hours / 24)} days`;
}
