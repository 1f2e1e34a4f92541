import { describe, expect, it } from 'vitest';
import { dumpFormData, dumpFormProblems, emptyDumpFields } from '@/components/uploads/dump-form';
import { budgetPosition, histogramData } from '@/components/uploads/histogram-chart';

const file = new File(['1,2\n3,4\n'], 'dump.csv');

describe('the counter dump form', () => {
  it('when a raw format has no width or depth, then both are asked for, and a depth past 64 is refused', () => {
    const fields = { ...emptyDumpFields(), format: 'u32le' as const, errorBudget: '500' };
    expect(dumpFormProblems(fields, file)).toEqual({ width: expect.stringMatching(/width is required/), depth: expect.stringMatching(/depth is required/) });
    expect(dumpFormProblems({ ...fields, width: '1024', depth: '65' }, file)).toEqual({ depth: 'depth must be a whole number from 1 to 64.' });
    expect(dumpFormProblems({ ...fields, width: '1024', depth: '4' }, file)).toEqual({});
  });

  it('when CSV leaves width and depth empty, then nothing is missing but the budget and the file', () => {
    expect(dumpFormProblems(emptyDumpFields(), null)).toEqual({ errorBudget: expect.stringMatching(/required, or choose a sketch/), file: 'Choose the dump file.' });
  });

  it('when a sketch is chosen, then the budget and confidence may be left empty, but not be wrong', () => {
    const fields = { ...emptyDumpFields(), sketchId: 3, confidence: '' };
    expect(dumpFormProblems(fields, file)).toEqual({});
    expect(dumpFormProblems({ ...fields, confidence: '1' }, file)).toEqual({ confidence: expect.stringMatching(/strictly between 0 and 1/) });
    expect(dumpFormProblems({ ...fields, errorBudget: '-2' }, file)).toEqual({ errorBudget: expect.stringMatching(/greater than 0/) });
  });

  it('when the form is sent, then the fields come before the file, and empty ones are left out', () => {
    const form = dumpFormData({ ...emptyDumpFields(), format: 'u64le', width: ' 2 ', depth: '2', errorBudget: '3', sketchId: 9 }, file);
    expect([...form.keys()]).toEqual(['format', 'width', 'depth', 'errorBudget', 'confidence', 'sketchId', 'file']);
    expect(form.get('width')).toBe('2');
  });
});

describe('the dump histogram', () => {
  const bins = [
    { from: 0, to: 0, cells: 5 },
    { from: 1, to: 1, cells: 0 },
    { from: 2, to: 3, cells: 2 },
    { from: 4, to: 7, cells: 1 },
  ];

  it('when a bin is empty, then it has no bar (a log scale has no zero)', () => {
    expect(histogramData(bins)).toEqual([[0, 1, 2, 3], [5, null, 2, 1]]);
  });

  it('when E falls inside a bin, then the brim is drawn in proportion inside it', () => {
    // Bin 3 holds 4…7 (four values); E = 6 is two values in: 3 − 0.5 + 2/4.
    expect(budgetPosition(bins, 6)).toBe(3);
    expect(budgetPosition(bins, 1)).toBe(1);
    expect(budgetPosition(bins, 100)).toBeNull();
  });
});
