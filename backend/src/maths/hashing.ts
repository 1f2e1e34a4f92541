/**
 * Row hashing for the count-min sketch. A key string is first reduced to a
 * 32-bit fingerprint by FNV-1a over its UTF-8 bytes (Fowler, Noll & Vo;
 * draft-eastlake-fnv), then each row maps the fingerprint with its own
 * Carter–Wegman function h(x) = ((a·x + b) mod p) mod m, p = 2^31 − 1
 * (Carter & Wegman, JCSS 18(2), 1979), which is pairwise independent for
 * random a ∈ [1, p), b ∈ [0, p): the collision bound of 1/m per row that the
 * sketch's guarantee rests on.
 */
export const MERSENNE_31 = 2 ** 31 - 1;

export interface RowSeed {
  a: number;
  b: number;
}

const FNV_OFFSET = 0x811c9dc5;
const FNV_PRIME = 0x01000193;

// Math.imul keeps the low 32 bits of the product exactly; a plain `*` would round once it passed 2^53.
const mix = (hash: number, byte: number) => Math.imul(hash ^ byte, FNV_PRIME);

/** FNV-1a (32-bit) of the key's UTF-8 bytes; a lone surrogate counts as U+FFFD, as TextEncoder writes it. */
export function fingerprint(key: string): number {
  let hash = FNV_OFFSET;
  for (let i = 0; i < key.length; i++) {
    let code = key.charCodeAt(i);
    if (code < 0x80) {
      hash = mix(hash, code);
      continue;
    }
    if (code < 0x800) {
      hash = mix(mix(hash, 0xc0 | (code >> 6)), 0x80 | (code & 63));
      continue;
    }
    if (code >= 0xd800 && code < 0xe000) {
      const next = key.charCodeAt(i + 1);
      if (code < 0xdc00 && next >= 0xdc00 && next < 0xe000) {
        const point = 0x10000 + ((code - 0xd800) << 10) + (next - 0xdc00);
        hash = mix(mix(hash, 0xf0 | (point >> 18)), 0x80 | ((point >> 12) & 63));
        hash = mix(mix(hash, 0x80 | ((point >> 6) & 63)), 0x80 | (point & 63));
        i++;
        continue;
      }
      code = 0xfffd;
    }
    hash = mix(mix(mix(hash, 0xe0 | (code >> 12)), 0x80 | ((code >> 6) & 63)), 0x80 | (code & 63));
  }
  return hash >>> 0;
}

/**
 * a·x mod p without leaving the doubles' exact range: a·x can reach 2^62, so
 * a is split at 16 bits; (a_hi·x mod p)·2^16 + a_lo·x stays below 2^48.
 */
function mulMod(a: number, x: number): number {
  const high = ((a >>> 16) * x) % MERSENNE_31;
  return (high * 65536 + (a & 0xffff) * x) % MERSENNE_31;
}

export function rowColumn(fingerprintValue: number, seed: RowSeed, width: number): number {
  return ((mulMod(seed.a, fingerprintValue % MERSENNE_31) + seed.b) % MERSENNE_31) % width;
}

export function isRowSeed(seed: RowSeed): boolean {
  return Number.isInteger(seed?.a) && Number.isInteger(seed?.b) && seed.a >= 1 && seed.a < MERSENNE_31 && seed.b >= 0 && seed.b < MERSENNE_31;
}

/** Draws one (a, b) per row from a random source in [0, 1). */
export function drawRowSeeds(depth: number, random: () => number): RowSeed[] {
  const seeds: RowSeed[] = [];
  for (let r = 0; r < depth; r++) {
    seeds.push({ a: 1 + Math.floor(random() * (MERSENNE_31 - 1)), b: Math.floor(random() * MERSENNE_31) });
  }
  return seeds;
}
