/** One small counter matrix written in every dump format, so each reader can be checked against the same hand-worked figures. */
export const SMALL = [
  [0, 3, 1, 4],
  [2, 0, 5, 1],
];

export const asCsv = (m: number[][], sep = ',') => m.map((row) => row.join(sep)).join('\n') + '\n';

export const asJson = (m: number[][], flat = false) =>
  JSON.stringify(flat ? { width: m[0].length, depth: m.length, counters: m.flat() } : { counters: m });

export function asRaw(m: number[][], bytes: 4 | 8): Uint8Array {
  const cells = m.flat();
  const out = new Uint8Array(cells.length * bytes);
  const view = new DataView(out.buffer);
  cells.forEach((v, i) => (bytes === 4 ? view.setUint32(i * 4, v, true) : view.setBigUint64(i * 8, BigInt(v), true)));
  return out;
}
