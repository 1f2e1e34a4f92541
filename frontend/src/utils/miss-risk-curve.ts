// Miss risk against stream total for one design: the chart's data, taken point
// by point from the shared `assess`, so the chart cannot disagree with it.
import { assess } from '@brimwatch/maths';

export interface MissRiskCurve {
  streamTotals: number[];
  /** Where the bound says nothing (n ≥ m·E) the risk is drawn at 1, its ceiling. */
  risks: number[];
}

export interface CurveDesign {
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  capacity: number;
}

/** From a tenth of the capacity (below that the risk is negligible) to twice it. */
export function missRiskCurve(design: CurveDesign, points = 160): MissRiskCurve {
  const from = design.capacity * 0.1;
  const to = design.capacity * 2;
  const streamTotals: number[] = [];
  const risks: number[] = [];
  for (let i = 0; i < points; i++) {
    const streamTotal = from + ((to - from) * i) / (points - 1);
    const { width, depth, errorBudget, confidence } = design;
    const { missRisk } = assess({ width, depth, errorBudget, confidence, streamTotal });
    streamTotals.push(streamTotal);
    risks.push(missRisk ?? 1);
  }
  return { streamTotals, risks };
}
