import { D2_N2 } from "./constants";
import { requireFinite, requireSeries, StatsInputError } from "./errors";

export type CapabilityInput = {
  /** Raw measurements; give either these or mean and sigma. */
  values?: number[];
  mean?: number;
  sigma?: number;
  lsl?: number;
  usl?: number;
};

export type CapabilityResult = {
  mean: number;
  /** σ used for Cp/Cpk: the given σ, or from raw values the within σ = average moving range / d2. */
  sigma: number;
  cp?: number;
  cpu?: number;
  cpl?: number;
  cpk: number;
  /** From raw values only: the overall sample standard deviation (n − 1) and the indices from it. */
  sigmaOverall?: number;
  pp?: number;
  ppk?: number;
};

/**
 * Process capability [std, NIST e-Handbook / Dataplot CPU, CPL]: Cp = (USL − LSL) / 6σ,
 * CPU = (USL − x̄) / 3σ, CPL = (x̄ − LSL) / 3σ, Cpk = min(CPU, CPL); with one limit, Cpk is the
 * index of that limit and Cp is undefined. From raw values, Cp/Cpk use the within σ (average
 * moving range / d2, d2 = 1.128) and Pp/Ppk the overall sample σ.
 */
export function capability(input: CapabilityInput): CapabilityResult {
  if (input === null || typeof input !== "object") {
    throw new StatsInputError("Give the measurements, or their mean and σ.", "values");
  }
  const { values, lsl, usl } = input;
  if (lsl === undefined && usl === undefined) {
    throw new StatsInputError("Give at least one specification limit (LSL or USL).", "usl");
  }
  if (lsl !== undefined) requireFinite(lsl, "LSL", "lsl");
  if (usl !== undefined) requireFinite(usl, "USL", "usl");
  if (lsl !== undefined && usl !== undefined && lsl >= usl) {
    throw new StatsInputError(`LSL (${lsl}) must be below USL (${usl}).`, "lsl");
  }

  if (values !== undefined) {
    if (input.mean !== undefined || input.sigma !== undefined) {
      throw new StatsInputError("Give either the measurements or mean and σ, not both.", "values");
    }
    requireSeries(values, 2, "Capability", "values");
    const n = values.length;
    let sum = 0;
    for (const v of values) sum += v;
    const mean = sum / n;
    let squares = 0;
    let movingRanges = 0;
    for (let i = 0; i < n; i++) {
      squares += (values[i] - mean) ** 2;
      if (i > 0) movingRanges += Math.abs(values[i] - values[i - 1]);
    }
    const sigmaOverall = Math.sqrt(squares / (n - 1));
    const sigmaWithin = movingRanges / (n - 1) / D2_N2;
    if (sigmaWithin === 0 || sigmaOverall === 0) {
      throw new StatsInputError(
        "The measurements do not vary, so σ is zero and capability is undefined.",
        "values",
      );
    }
    const within = indices(mean, sigmaWithin, lsl, usl);
    const overall = indices(mean, sigmaOverall, lsl, usl);
    return {
      ...within,
      sigmaOverall,
      ...(overall.cp !== undefined ? { pp: overall.cp } : {}),
      ppk: overall.cpk,
    };
  }

  if (input.mean === undefined || input.sigma === undefined) {
    throw new StatsInputError("Give the measurements, or both their mean and σ.", "mean");
  }
  const mean = requireFinite(input.mean, "Mean", "mean");
  const sigma = requireFinite(input.sigma, "σ", "sigma");
  if (sigma <= 0) throw new StatsInputError(`σ must be greater than zero (got ${sigma}).`, "sigma");
  return indices(mean, sigma, lsl, usl);
}

function indices(mean: number, sigma: number, lsl?: number, usl?: number): CapabilityResult {
  const result: CapabilityResult = { mean, sigma, cpk: Number.NaN };
  if (usl !== undefined) result.cpu = (usl - mean) / (3 * sigma);
  if (lsl !== undefined) result.cpl = (mean - lsl) / (3 * sigma);
  if (usl !== undefined && lsl !== undefined) result.cp = (usl - lsl) / (6 * sigma);
  result.cpk = Math.min(result.cpu ?? Infinity, result.cpl ?? Infinity);
  return result;
}
