import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MERSENNE_31, drawRowSeeds, fingerprint, mulberry32, rowColumn } from '../../../backend/src/maths';

/** FNV-1a over explicit bytes, the reference algorithm's plain loop. */
function fnv1a(bytes: Uint8Array): number {
  let hash = 0x811c9dc5;
  for (const byte of bytes) hash = Math.imul(hash ^ byte, 0x01000193) >>> 0;
  return hash;
}

describe('fingerprint', () => {
  it('when known strings are hashed, then FNV-1a gives the published test vectors', () => {
    // FNV-1a 32-bit test vectors (Fowler/Noll/Vo reference test suite, draft-eastlake-fnv); recalled from memory
    // and confirmed by a separate byte-by-byte computation before writing this test.
    expect(fingerprint('')).toBe(0x811c9dc5);
    expect(fingerprint('a')).toBe(0xe40c292c);
    expect(fingerprint('foobar')).toBe(0xbf9cf968);
  });

  it('when any string is hashed, then it equals FNV-1a of the bytes TextEncoder writes', () => {
    const encoder = new TextEncoder();
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 40 }), (key) => fingerprint(key) === fnv1a(encoder.encode(key))),
      { seed: 1991, numRuns: 1_000 },
    );
    // Lone surrogates are written as U+FFFD by TextEncoder (WHATWG Encoding Standard).
    expect(fingerprint('a\ud800b')).toBe(fnv1a(encoder.encode('a\ud800b')));
    expect(fingerprint('\udc00')).toBe(fnv1a(encoder.encode('\ufffd')));
  });
});

describe('row hash', () => {
  it('when (a·x + b) mod p is computed, then it matches exact BigInt arithmetic', () => {
    const P = BigInt(MERSENNE_31);
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: MERSENNE_31 - 1 }),
        fc.integer({ min: 0, max: MERSENNE_31 - 1 }),
        fc.integer({ min: 0, max: 0xffffffff }),
        fc.integer({ min: 1, max: MERSENNE_31 }),
        (a, b, x, width) => {
          const exact = Number((((BigInt(a) * (BigInt(x) % P) + BigInt(b)) % P) % BigInt(width)));
          return rowColumn(x, { a, b }, width) === exact;
        },
      ),
      { seed: 1979, numRuns: 2_000 },
    );
  });

  it('when two keys are hashed under many random seeds, then they collide about 1/m of the time', () => {
    // Carter & Wegman, JCSS 18(2) 1979: for a universal family, P[h(x) = h(y)] ≤ 1/m (here about 1/m, as p ≫ m).
    const width = 64;
    const seeds = drawRowSeeds(20_000, mulberry32(42));
    const pairs = [
      ['checkout:alice', 'checkout:bob'],
      ['1', '2'],
      ['ads-rank', 'ads-ranl'],
    ];
    for (const [x, y] of pairs) {
      const fx = fingerprint(x);
      const fy = fingerprint(y);
      const collisions = seeds.filter((seed) => rowColumn(fx, seed, width) === rowColumn(fy, seed, width)).length;
      // 1/64 = 0.0156; binomial SD over 20,000 draws ≈ 0.00088: allow 4 SDs.
      expect(Math.abs(collisions / seeds.length - 1 / width)).toBeLessThan(0.0036);
    }
  });

  it('when many keys go through one row, then the columns fill evenly', () => {
    const width = 100;
    const [seed] = drawRowSeeds(1, mulberry32(9));
    const counts = new Array(width).fill(0);
    for (let i = 0; i < 100_000; i++) counts[rowColumn(fingerprint(`key-${i}`), seed, width)]++;
    // Pearson's χ² with 99 degrees of freedom: mean 99, SD 14; 99 + 4·14 ≈ 155.
    const chiSquare = counts.reduce((sum, c) => sum + (c - 1_000) ** 2 / 1_000, 0);
    expect(chiSquare).toBeLessThan(155);
  });
});
