import { describe, expect, it } from 'vitest';
import { readSketch } from '../../collectors/exposition/read-sketch';
import { GOOD, promClientBody, type Figures } from './exposition-bodies';

const EXPECTED = { width: 2719, depth: 4, streamTotal: 1_000_000, nonzeroCells: [2000, 1990, 2010, 1985], counterBytes: 4, windowSeconds: 0, conservative: false };

async function reasonFor(figures: Figures, openMetrics = true): Promise<string> {
  const { body, contentType } = await promClientBody(figures, openMetrics);
  const read = readSketch(body, contentType, 'limiter');
  if (read.ok) throw new Error('expected a failure');
  return read.reason;
}

describe('readSketch from a text exposition', () => {
  it.each([true, false])('when prom-client writes the sketch (OpenMetrics: %s), then every figure is read', async (openMetrics) => {
    const { body, contentType } = await promClientBody(GOOD, openMetrics);
    expect(readSketch(body, contentType, 'limiter')).toEqual({ ok: true, value: EXPECTED });
  });

  it('when the exposition carries other sketches and metrics in any order, then only the asked sketch is read', () => {
    const body = [
      'countmin_nonzero_cells{sketch="limiter",row="1"} 5',
      'process_cpu_seconds_total 12',
      'countmin_width{sketch="other"} 8',
      '# TYPE countmin_stream counter',
      'countmin_stream_total{sketch="limiter",instance="a"} 42 1700000000000',
      'countmin_nonzero_cells{sketch="limiter",row="0"} 6',
      'countmin_conservative{sketch="limiter"} 1',
      'countmin_depth{sketch="limiter"} 2',
      'countmin_width{sketch="limiter"} 10',
      'countmin_counter_bytes{sketch="limiter"} 8',
      'countmin_window_seconds{sketch="limiter"} 3600',
    ].join('\n');
    expect(readSketch(body, 'text/plain; version=0.0.4', 'limiter')).toEqual({
      ok: true,
      value: { width: 10, depth: 2, streamTotal: 42, nonzeroCells: [6, 5], counterBytes: 8, windowSeconds: 3600, conservative: true },
    });
  });

  it.each([
    ['width', 'missing metric countmin_width for sketch="limiter"'],
    ['depth', 'missing metric countmin_depth for sketch="limiter"'],
    ['streamTotal', 'missing metric countmin_stream_total for sketch="limiter"'],
    ['counterBytes', 'missing metric countmin_counter_bytes for sketch="limiter"'],
    ['windowSeconds', 'missing metric countmin_window_seconds for sketch="limiter"'],
    ['conservative', 'missing metric countmin_conservative for sketch="limiter"'],
    ['nonzeroCells', 'missing metric countmin_nonzero_cells for sketch="limiter"'],
  ] as const)('when %s is missing, then the reason is %j and no zero stands in', async (field, reason) => {
    expect(await reasonFor({ ...GOOD, [field]: undefined })).toBe(reason);
  });

  it.each([
    [{ width: NaN }, 'countmin_width is NaN for sketch="limiter" (line'],
    [{ depth: Infinity }, 'countmin_depth is +Inf for sketch="limiter"'],
    [{ width: 12.5 }, 'countmin_width must be a whole number (got 12.5)'],
    [{ width: 0 }, 'countmin_width must be at least 1 (got 0)'],
    [{ counterBytes: 3 }, 'countmin_counter_bytes must be 1, 2, 4 or 8 (got 3)'],
    [{ conservative: 0.5 }, 'countmin_conservative must be 0 or 1 (got 0.5)'],
    [{ windowSeconds: -60 }, 'countmin_window_seconds is negative (-60)'],
    [{ nonzeroCells: { '0': 1, '1': 1, '2': 1 } }, 'countmin_nonzero_cells for sketch="limiter" has 3 rows but the depth is 4'],
    [{ nonzeroCells: { '0': 1, '1': 1, '2': 1, '7': 1 } }, 'has row 7, outside 0..3'],
    [{ nonzeroCells: { '0': 1, '1': 1, '2': 1, '3': 2720 } }, 'of row 3 is 2720, more than the width 2719'],
    [{ nonzeroCells: { '0': 1, '1': -1, '2': 1, '3': 1 } }, 'of row 1 is negative (-1)'],
    [{ nonzeroCells: { '0': 1, '1': 1.5, '2': 1, '3': 1 } }, 'of row 1 must be a whole number (got 1.5)'],
    [{ nonzeroCells: { '0': 1, '1': 1, '2': 1, first: 1 } }, 'needs a row label 0, 1, 2, … (got "first")'],
  ] as const)('when the figures are %j, then the reason contains %j', async (change, reason) => {
    expect(await reasonFor({ ...GOOD, ...change } as Figures)).toContain(reason);
  });

  it('when the stream total is NaN or negative, then the scrape fails with that reason', () => {
    const body = (total: string) => `countmin_width{sketch="s"} 4\ncountmin_depth{sketch="s"} 1\ncountmin_stream_total{sketch="s"} ${total}\ncountmin_nonzero_cells{sketch="s",row="0"} 1\ncountmin_counter_bytes{sketch="s"} 4\ncountmin_window_seconds{sketch="s"} 0\ncountmin_conservative{sketch="s"} 0\n`;
    expect(readSketch(body('NaN'), 'text/plain', 's')).toEqual({ ok: false, reason: 'countmin_stream_total is NaN for sketch="s" (line 3)' });
    expect(readSketch(body('-5'), 'text/plain', 's')).toEqual({ ok: false, reason: 'countmin_stream_total is negative (-5) for sketch="s" (line 3)' });
  });

  it('when a figure appears twice for the sketch, then both lines are named', () => {
    const body = 'countmin_width{sketch="s",pod="a"} 4\ncountmin_width{sketch="s",pod="b"} 4\n';
    expect(readSketch(body, 'text/plain', 's')).toEqual({ ok: false, reason: 'countmin_width for sketch="s" appears 2 times (lines 1, 2); expected once' });
  });

  it('when the sketch label is not in the exposition, then the reason names the labels that are', async () => {
    const { body, contentType } = await promClientBody(GOOD, false, 'quota');
    expect(readSketch(body, contentType, 'limiter')).toEqual({
      ok: false,
      reason: 'missing sketch: no countmin_* metric with sketch="limiter" in the exposition; it carries sketch="quota"',
    });
  });
});

describe('readSketch from the JSON form', () => {
  const json = (entry: Record<string, unknown>) => JSON.stringify({ sketches: { limiter: entry } });
  const GOOD_JSON = { ...EXPECTED };

  it('when every field is given, then the sample matches the text form', () => {
    expect(readSketch(json(GOOD_JSON), 'application/json', 'limiter')).toEqual({ ok: true, value: EXPECTED });
    expect(readSketch(json({ ...GOOD_JSON, conservative: 1 }), undefined, 'limiter')).toEqual({ ok: true, value: { ...EXPECTED, conservative: true } });
  });

  it.each([
    [{ ...GOOD_JSON, depth: undefined }, 'missing field depth for sketch "limiter"'],
    [{ ...GOOD_JSON, streamTotal: '12' }, 'field streamTotal of sketch "limiter" must be a number (got string)'],
    [{ ...GOOD_JSON, streamTotal: -1 }, 'field streamTotal is negative (-1) for sketch "limiter"'],
    [{ ...GOOD_JSON, nonzeroCells: 5 }, 'field nonzeroCells of sketch "limiter" must be a list with one count per row'],
    [{ ...GOOD_JSON, nonzeroCells: [1, 2] }, 'field nonzeroCells of sketch "limiter" has 2 rows but the depth is 4; expected one per row 0..3'],
    [{ ...GOOD_JSON, conservative: 'yes' }, 'field conservative of sketch "limiter" must be true or false (got string)'],
  ])('when the entry is %j, then the reason is %j', (entry, reason) => {
    expect(readSketch(json(entry), 'application/json', 'limiter')).toEqual({ ok: false, reason });
  });

  it('when the body is not JSON or has no sketches, then the reason says so', () => {
    const broken = readSketch('{"sketches": ', 'application/json', 'limiter');
    expect(broken.ok === false && broken.reason.startsWith('parse error in JSON:')).toBe(true);
    expect(readSketch('[1]', 'application/json', 'limiter')).toEqual({ ok: false, reason: 'the JSON form needs an object {"sketches": {"<label>": {...}}}; no "sketches" object found' });
    expect(readSketch(JSON.stringify({ sketches: { other: {} } }), 'application/json', 'limiter')).toEqual({
      ok: false,
      reason: 'missing sketch: no sketch "limiter" in the JSON form; it carries "other"',
    });
  });
});
