import { describe, expect, it } from 'vitest';
import {
  formatBytes,
  formatCompact,
  formatCount,
  formatLoad,
  formatPowerOfTen,
  formatRelative,
  formatRisk,
} from '@/utils/format';

// Expected strings are worked out by hand from the rules in LOOK.md; the
// separators are spelled out as escapes so an invisible character cannot hide.
const THIN = '\u2009';
const UNIT = '\u202F';

describe('formatCount', () => {
  it('when a count has more than three digits, then thin spaces group its thousands', () => {
    expect(formatCount(1234567)).toBe(`1${THIN}234${THIN}567`);
    expect(formatCount(1000)).toBe(`1${THIN}000`);
    expect(formatCount(999)).toBe('999');
  });

  it('when a count has a fraction or a sign, then it is rounded and a true minus is used', () => {
    expect(formatCount(2718.5)).toBe(`2${THIN}719`);
    expect(formatCount(-45000)).toBe(`−45${THIN}000`);
  });

  it('when a value is not a number, then a dash stands in for it', () => {
    expect(formatCount(Number.NaN)).toBe('—');
  });
});

describe('formatBytes', () => {
  it('when memory is under 1 KiB, then it is shown in bytes', () => {
    expect(formatBytes(512)).toBe(`512${UNIT}B`);
  });

  it('when memory is in KiB, MiB or GiB, then it uses binary units with one decimal below 100', () => {
    // 272 × 5 × 4 B = 5440 B; 5440 / 1024 = 5.3125 → 5.3 KiB.
    expect(formatBytes(5440)).toBe(`5.3${UNIT}KiB`);
    // 1 048 576 B = 1024² B = exactly 1 MiB.
    expect(formatBytes(1048576)).toBe(`1${UNIT}MiB`);
    // 27 183 × 5 × 4 B = 543 660 B; / 1024 = 530.9 → 531 KiB (no decimal at 100 and above).
    expect(formatBytes(543660)).toBe(`531${UNIT}KiB`);
    // 3 × 1024³ B = 3 GiB.
    expect(formatBytes(3 * 1024 ** 3)).toBe(`3${UNIT}GiB`);
  });

  it('when rounding would print 1 024 of a unit, then it carries to the next unit', () => {
    // 1 048 575 B / 1024 = 1023.999 KiB, which rounds to 1024 KiB = 1 MiB.
    expect(formatBytes(1048575)).toBe(`1${UNIT}MiB`);
  });
});

describe('formatRisk', () => {
  it('when a risk is small, then it reads as a mantissa times a power of ten in superscript', () => {
    expect(formatRisk(0.00029)).toBe('2.9 × 10⁻⁴');
    expect(formatRisk(0.01)).toBe('1.0 × 10⁻²');
    // 0.0000123 = 1.23 × 10⁻⁵ → two significant figures.
    expect(formatRisk(0.0000123)).toBe('1.2 × 10⁻⁵');
  });

  it('when a risk is 0.1 or more, then it reads as a short decimal', () => {
    expect(formatRisk(0.35)).toBe('0.35');
    expect(formatRisk(0.5)).toBe('0.5');
    expect(formatRisk(0.998)).toBe('> 0.99');
  });

  it('when there is no guarantee, then it says so in words', () => {
    expect(formatRisk(null)).toBe('no guarantee');
  });
});

describe('formatLoad', () => {
  it('when a load is a fraction, then it is a whole percentage rounded down', () => {
    expect(formatLoad(0.834)).toBe(`83${UNIT}%`);
    // 0.29 × 100 is 28.999… in floating point; it must still read 29 %.
    expect(formatLoad(0.29)).toBe(`29${UNIT}%`);
    expect(formatLoad(0.9999)).toBe(`99${UNIT}%`);
    expect(formatLoad(1)).toBe(`100${UNIT}%`);
    expect(formatLoad(12.5)).toBe(`1${THIN}250${UNIT}%`);
  });

  it('when a load is above zero but under 1 %, then it does not read as empty', () => {
    expect(formatLoad(0.004)).toBe(`<${UNIT}1${UNIT}%`);
    expect(formatLoad(0)).toBe(`0${UNIT}%`);
  });
});

describe('formatRelative', () => {
  const now = new Date('2025-06-10T12:00:00Z');

  it('when a date is ahead, then it reads "in …"', () => {
    expect(formatRelative(new Date('2025-06-16T12:00:00Z'), now)).toBe('in 6 days');
    expect(formatRelative(new Date('2025-06-11T12:00:00Z'), now)).toBe('in 1 day');
    expect(formatRelative(new Date('2025-06-10T17:00:00Z'), now)).toBe('in 5 h');
  });

  it('when a date is past, then it reads "… ago"', () => {
    expect(formatRelative(new Date('2025-06-10T11:57:00Z'), now)).toBe('3 min ago');
    // 2025-03-12 to 2025-06-10 is 90 days = 3 months of 30 days.
    expect(formatRelative('2025-03-12T12:00:00Z', now)).toBe('3 months ago');
  });

  it('when a date is within 45 seconds, then it reads "just now"', () => {
    expect(formatRelative(new Date('2025-06-10T11:59:30Z'), now)).toBe('just now');
  });
});

describe('axis labels', () => {
  it('when a chart labels its axes, then counts are short and powers of ten are superscript', () => {
    expect(formatCompact(150_000_000)).toBe(`150${UNIT}M`);
    expect(formatCompact(2500)).toBe(`2.5${UNIT}k`);
    expect(formatCompact(40)).toBe('40');
    expect(formatPowerOfTen(-12)).toBe('10⁻¹²');
  });
});
