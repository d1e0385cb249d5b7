import { D2_N2, D4_N2 } from "./constants";
import { requireSeries } from "./errors";

export type ControlRule =
  /** An individual value beyond the 3σ limits. */
  | "beyond-limits"
  /** The eighth (or later) value in a run on one side of the centre line. */
  | "run-of-8"
  /** A moving range above its upper limit. */
  | "moving-range-above-limit";

export type OutOfControlPoint = {
  /** Index into `values` (for moving ranges: the later of the two values). */
  index: number;
  value: number;
  rule: ControlRule;
};

export type IndividualsChart = {
  individuals: { centre: number; ucl: number; lcl: number };
  movingRange: { centre: number; ucl: number; lcl: number };
  /** |x_i − x_{i−1}| for i = 1 … n − 1. */
  movingRanges: number[];
  /** Within σ = average moving range / d2. */
  sigma: number;
  outOfControl: OutOfControlPoint[];
};

export const RUN_LENGTH = 8;

/**
 * Individuals and moving-range chart [std, ASTM E2587 / NIST e-Handbook]: centre x̄, limits
 * x̄ ± 3·MR̄/d2 (d2 = 1.128); moving-range centre MR̄, upper limit D4·MR̄ (D4 = 3.267), lower 0.
 * Flags values beyond the limits, runs of 8 on one side of the centre line, and moving ranges above
 * their limit.
 */
export function individualsChart(values: number[]): IndividualsChart {
  requireSeries(values, 2, "An individuals chart", "values");
  const n = values.length;
  let sum = 0;
  for (const v of values) sum += v;
  // A series with no variation sits on its centre line: twenty readings of 3.1 sum to a mean of
  // 3.100000000000001, which would put every reading beyond limits that are zero apart.
  const centre = values.every((v) => v === values[0]) ? values[0] : sum / n;
  const movingRanges: number[] = [];
  for (let i = 1; i < n; i++) movingRanges.push(Math.abs(values[i] - values[i - 1]));
  const mrBar = movingRanges.reduce((a, b) => a + b, 0) / movingRanges.length;
  const sigma = mrBar / D2_N2;
  const ucl = centre + 3 * sigma;
  const lcl = centre - 3 * sigma;
  const mrUcl = D4_N2 * mrBar;

  const outOfControl: OutOfControlPoint[] = [];
  let runSide = 0;
  let runLength = 0;
  for (let i = 0; i < n; i++) {
    const x = values[i];
    if (x > ucl || x < lcl) outOfControl.push({ index: i, value: x, rule: "beyond-limits" });
    // A value on the centre line breaks a run.
    const side = x > centre ? 1 : x < centre ? -1 : 0;
    if (side !== 0 && side === runSide) runLength++;
    else {
      runSide = side;
      runLength = side === 0 ? 0 : 1;
    }
    if (runLength >= RUN_LENGTH) outOfControl.push({ index: i, value: x, rule: "run-of-8" });
  }
  movingRanges.forEach((mr, i) => {
    if (mr > mrUcl)
      outOfControl.push({ index: i + 1, value: mr, rule: "moving-range-above-limit" });
  });
  outOfControl.sort((a, b) => a.index - b.index);

  return {
    individuals: { centre, ucl, lcl },
    movingRange: { centre: mrBar, ucl: mrUcl, lcl: 0 },
    movingRanges,
    sigma,
    outOfControl,
  };
}
