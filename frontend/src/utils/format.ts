// How Brimwatch writes figures (LOOK.md): one module so every page agrees.

/** Thousands separator: a thin space, unambiguous in every locale. */
export const THIN_SPACE = '\u2009';
/** Between a figure and its unit: a narrow space that never breaks the line. */
export const UNIT_SPACE = '\u202F';

const NO_FIGURE = '—';

function groupDigits(digits: string): string {
  return digits.replace(/\B(?=(\d{3})+(?!\d))/g, THIN_SPACE);
}

/** A count rounded to a whole number, thousands grouped: 1234567 → "1 234 567". */
export function formatCount(value: number): string {
  if (!Number.isFinite(value)) return NO_FIGURE;
  const rounded = Math.round(value);
  const sign = rounded < 0 ? '−' : '';
  return sign + groupDigits(String(Math.abs(rounded)));
}

const COMPACT_UNITS = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
] as const;

/** A count shortened for tight spaces such as chart axes: 150000000 → "150 M", 2500 → "2.5 k". */
export function formatCompact(value: number): string {
  if (!Number.isFinite(value)) return NO_FIGURE;
  const size = Math.abs(value);
  for (const [scale, unit] of COMPACT_UNITS) {
    if (size >= scale) {
      const scaled = value / scale;
      const shown = Math.abs(scaled) < 100 ? String(Number(scaled.toFixed(1))) : formatCount(scaled);
      return `${shown.replace('-', '−')}${UNIT_SPACE}${unit}`;
    }
  }
  return String(Number(value.toFixed(2))).replace('-', '−');
}

const BYTE_UNITS = ['KiB', 'MiB', 'GiB', 'TiB'] as const;

/** Memory in binary units, one decimal below 100 of a unit: 5440 → "5.3 KiB". */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return NO_FIGURE;
  if (bytes < 1024) return `${formatCount(bytes)}${UNIT_SPACE}B`;
  let value = bytes / 1024;
  let unit = 0;
  while (value >= 1024 && unit < BYTE_UNITS.length - 1) {
    value /= 1024;
    unit += 1;
  }
  const shown = value < 100 ? value.toFixed(1).replace(/\.0$/, '') : formatCount(value);
  // 1023.96 KiB rounds to "1 024 KiB"; carry it up so it reads "1 MiB".
  if (shown === formatCount(1024) && unit < BYTE_UNITS.length - 1) {
    return `1${UNIT_SPACE}${BYTE_UNITS[unit + 1]}`;
  }
  return `${shown}${UNIT_SPACE}${BYTE_UNITS[unit]}`;
}

const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴',
  '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

function superscript(exponent: number): string {
  return [...String(exponent)].map((ch) => SUPERSCRIPT[ch]).join('');
}

/** An exact power of ten, for log-scale axes: -4 → "10⁻⁴". */
export function formatPowerOfTen(exponent: number): string {
  return `10${superscript(exponent)}`;
}

/**
 * A probability: plain decimals from 0.1 up, otherwise two significant
 * figures times a power of ten ("2.9 × 10⁻⁴"); null means no guarantee holds.
 */
export function formatRisk(probability: number | null): string {
  if (probability === null) return 'no guarantee';
  if (!Number.isFinite(probability) || probability < 0) return NO_FIGURE;
  if (probability === 0) return '0';
  if (probability >= 1) return '1';
  if (probability >= 0.1) {
    const text = probability.toFixed(2);
    // 0.996 must not read as a certainty.
    return text === '1.00' ? '> 0.99' : text.replace(/0$/, '');
  }
  const [mantissa, exponent] = probability.toExponential(1).split('e');
  return `${mantissa} × 10${superscript(Number(exponent))}`;
}

/**
 * A load (fraction of capacity) as a whole percentage. Rounds down, so "100 %"
 * appears only once the budget really no longer holds and the figure never
 * crosses the watch line before the level does.
 */
export function formatLoad(fraction: number): string {
  if (!Number.isFinite(fraction) || fraction < 0) return NO_FIGURE;
  if (fraction > 0 && fraction < 0.01) return `<${UNIT_SPACE}1${UNIT_SPACE}%`;
  return `${formatCount(Math.floor(fraction * 100 + 1e-9))}${UNIT_SPACE}%`;
}

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

function plural(count: number, unit: string): string {
  return `${count} ${unit}${count === 1 ? '' : 's'}`;
}

function span(ms: number): string {
  const minutes = Math.round(ms / MINUTE);
  if (minutes < 60) return `${minutes} min`;
  const hours = Math.round(ms / HOUR);
  if (hours < 24) return `${hours} h`;
  const days = Math.round(ms / DAY);
  if (days < 60) return plural(days, 'day');
  const months = Math.round(days / 30);
  if (months < 24) return plural(months, 'month');
  return plural(Math.round(days / 365), 'year');
}

/** A date relative to now: "in 6 days", "3 min ago", "just now". */
export function formatRelative(date: Date | string | number, now: Date = new Date()): string {
  const when = new Date(date).getTime();
  if (Number.isNaN(when)) return NO_FIGURE;
  const delta = when - now.getTime();
  if (Math.abs(delta) < 45_000) return 'just now';
  const text = span(Math.abs(delta));
  return delta > 0 ? `in ${text}` : `${text} ago`;
}
