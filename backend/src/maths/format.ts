/**
 * Plain formatting for sentences the maths writes (resize reasons, dump
 * verdicts). Fixed to comma thousands separators so a sentence reads the same
 * on the server, in the browser and in e-mail, whatever the locale.
 */
export function formatCount(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (Math.abs(value) < 100 && !Number.isInteger(value)) return String(Number(value.toPrecision(3)));
  return Math.round(value)
    .toString()
    .replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

const BYTE_UNITS = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];

export function formatBytes(bytes: number): string {
  let value = Math.abs(bytes);
  let unit = 0;
  while (value >= 1024 && unit < BYTE_UNITS.length - 1) {
    value /= 1024;
    unit++;
  }
  const sign = bytes < 0 ? '−' : '';
  return unit === 0 ? `${sign}${formatCount(value)} bytes` : `${sign}${Number(value.toPrecision(3))} ${BYTE_UNITS[unit]}`;
}

/** 0.99 → "99 %", 0.999 → "99.9 %"; `significant` trims measured figures such as a load. */
export function formatPercent(fraction: number, significant = 10): string {
  return `${Number((fraction * 100).toPrecision(significant))} %`;
}
