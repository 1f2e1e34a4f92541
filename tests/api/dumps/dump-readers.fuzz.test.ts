import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AppError } from '../../../backend/src/http/errors';
import { analyseDump } from '../../../backend/src/maths/dump';
import { createDumpReader, type DumpSettings } from '../../../backend/src/services/dumps/dump-reader';
import { DUMP_FORMATS } from '../../../backend/src/services/dumps/shape';
import { asCsv, asJson, asRaw } from './dump-matrices';

/** Feeds bytes in the given chunk sizes (cycled), as a network would split them. */
function read(settings: DumpSettings, bytes: Uint8Array, cuts: number[]) {
  const reader = createDumpReader(settings);
  let at = 0;
  for (let i = 0; at < bytes.length; i++) {
    const size = Math.max(1, cuts.length ? cuts[i % cuts.length] : bytes.length);
    reader.write(bytes.subarray(at, at + size));
    at += size;
  }
  return reader.finish();
}

const outcome = (work: () => unknown): 'report' | 'refused' => {
  try {
    work();
    return 'report';
  } catch (error) {
    if (error instanceof AppError && error.status === 400) return 'refused';
    throw error;
  }
};

const settingsArb = fc.record({
  format: fc.constantFrom(...DUMP_FORMATS),
  width: fc.option(fc.integer({ min: 1, max: 40 }), { nil: undefined }),
  depth: fc.option(fc.integer({ min: 1, max: 70 }), { nil: undefined }),
  errorBudget: fc.double({ min: 0.5, max: 1e6, noNaN: true }),
  confidence: fc.double({ min: 0.01, max: 0.999, noNaN: true }),
});
const cutsArb = fc.array(fc.integer({ min: 1, max: 600 }), { maxLength: 6 });
const matrixArb = (maxValue: number) =>
  fc.integer({ min: 1, max: 12 }).chain((width) => fc.array(fc.array(fc.integer({ min: 0, max: maxValue }), { minLength: width, maxLength: width }), { minLength: 1, maxLength: 6 }));

const enc = new TextEncoder();

describe('dump readers under random input', () => {
  it('when any bytes arrive in any chunks for any format, then the answer is a report or a 400, never a crash', () => {
    fc.assert(
      fc.property(settingsArb, fc.uint8Array({ maxLength: 2000 }), cutsArb, (settings, bytes, cuts) => {
        expect(['report', 'refused']).toContain(outcome(() => read(settings, bytes, cuts)));
      }),
      { numRuns: 2000 },
    );
  });

  it('when text that looks like a dump is mangled at random, then the answer is a report or a 400', () => {
    const alphabet = fc.constantFrom(...'0123456789,;\t \r\n-.e+"{}[]:x'.split(''));
    fc.assert(
      fc.property(fc.constantFrom('csv' as const, 'json' as const), fc.array(alphabet, { maxLength: 300 }), cutsArb, (format, chars, cuts) => {
        const text = (format === 'json' ? '{"counters":' : '') + chars.join('');
        expect(['report', 'refused']).toContain(outcome(() => read({ format, errorBudget: 10, confidence: 0.99 }, enc.encode(text), cuts)));
      }),
      { numRuns: 3000 },
    );
  });

  it('when a random matrix is written in each format and split at random, then each report equals the maths module on the matrix', () => {
    fc.assert(
      fc.property(matrixArb(0xffffffff), cutsArb, (m, cuts) => {
        const expected = analyseDump({ width: m[0].length, depth: m.length, errorBudget: 1000, confidence: 0.99, counters: m.flat() });
        const base = { errorBudget: 1000, confidence: 0.99 };
        const shape = { width: m[0].length, depth: m.length };
        const results = [
          read({ ...base, format: 'csv' }, enc.encode(asCsv(m)), cuts),
          read({ ...base, format: 'csv' }, enc.encode(asCsv(m, '\t')), cuts),
          read({ ...base, format: 'json' }, enc.encode(asJson(m)), cuts),
          read({ ...base, format: 'json' }, enc.encode(asJson(m, true)), cuts),
          read({ ...base, ...shape, format: 'u64le' }, asRaw(m, 8), cuts),
        ];
        // A matrix of text-like bytes only would be refused as raw; that case has its own test.
        const raw32 = asRaw(m, 4);
        if (raw32.some((b) => b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d)) results.push(read({ ...base, ...shape, format: 'u32le' }, raw32, cuts));
        for (const { analysis } of results) {
          expect(analysis.rows).toEqual(expected.rows);
          expect(analysis.empiricalMissRisk).toBe(expected.empiricalMissRisk);
          expect(analysis.markovMissRisk).toBe(expected.markovMissRisk);
        }
      }),
      { numRuns: 120 },
    );
  });

  it('when counters need more than 32 bits, then text and 64-bit dumps keep them', () => {
    fc.assert(
      fc.property(matrixArb(Number.MAX_SAFE_INTEGER), cutsArb, (m, cuts) => {
        const sums = m.map((row) => row.reduce((a, b) => a + b, 0));
        const csv = read({ format: 'csv', errorBudget: 1, confidence: 0.9 }, enc.encode(asCsv(m)), cuts);
        const raw = read({ format: 'u64le', width: m[0].length, depth: m.length, errorBudget: 1, confidence: 0.9 }, asRaw(m, 8), cuts);
        expect(csv.analysis.rows.map((r) => r.sum)).toEqual(sums);
        expect(raw.analysis.rows.map((r) => r.sum)).toEqual(sums);
      }),
      { numRuns: 200 },
    );
  });
});
