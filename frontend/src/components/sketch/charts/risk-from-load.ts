// Miss risk from a recorded load, so the history chart needs no width or
// budget per point. With capacity n_cap = m·E·δ^(1/k) (DESIGN.md), the ratio
// n/(m·E) equals load·δ^(1/k), and the Markov risk (n/(m·E))^k = δ·load^k.

/**
 * The miss risk of a sketch of depth k at this load, for a target confidence
 * 1 − δ; 1 where the bound says nothing (n ≥ m·E); null at zero load, which a
 * log scale cannot show.
 */
export function riskFromLoad(load: number | null, delta: number, depth: number): number | null {
  if (load === null || !(load > 0) || !(depth > 0) || !(delta > 0 && delta < 1)) return null;
  const perCellShare = load * delta ** (1 / depth);
  return perCellShare >= 1 ? 1 : perCellShare ** depth;
}
