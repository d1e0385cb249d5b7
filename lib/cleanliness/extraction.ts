import { CleanlinessInputError } from "./errors";
import { requireOpenFraction, requirePositiveInteger } from "./validate";

export type ExtractionOptions = {
  /** Largest decay value that completes the extraction; 0.1 (10 %) by default. */
  maxRatio?: number;
  /** Extractions allowed before the parameters must change; 6 by default. */
  maxExtractions?: number;
};

export type ExtractionStatus =
  /** The decay value fell to the limit within the allowed extractions. */
  | "complete"
  /** Not yet: extract again (the series is shorter than the allowed number). */
  | "extract-again"
  /** Not reached within the allowed extractions: change the parameters and qualify again. */
  | "change-parameters";

export type ExtractionResult = {
  complete: boolean;
  /** The extraction n at which the decay value first met the limit, or null. */
  step: number | null;
  /**
   * Decay values C_n / (C_1 + … + C_n) for n = 1 … step when complete, otherwise for every
   * extraction evaluated (at most `maxExtractions`). Extractions after `step` are not part of the
   * test and are not evaluated.
   */
  ratios: number[];
  status: ExtractionStatus;
};

export const DEFAULT_EXTRACTION_MAX_RATIO = 0.1; // [std] VDA 19.1 / ISO 16232 declining test
export const DEFAULT_MAX_EXTRACTIONS = 6; // [std] VDA 19.1 / ISO 16232

/**
 * Declining test of an extraction procedure [std, VDA 19.1 / ISO 16232]: after extraction n the
 * decay value is C_n / (C_1 + … + C_n); the extraction is complete at the first n where it is
 * ≤ 10 %. If that is not reached within 6 extractions the parameters must be changed.
 */
export function evaluateExtraction(series: number[], opts?: ExtractionOptions): ExtractionResult {
  const maxRatio = requireOpenFraction(
    opts?.maxRatio ?? DEFAULT_EXTRACTION_MAX_RATIO,
    "The decay-value limit",
    "maxRatio",
  );
  const maxExtractions = requirePositiveInteger(
    opts?.maxExtractions ?? DEFAULT_MAX_EXTRACTIONS,
    "The number of extractions allowed",
    "maxExtractions",
  );
  if (!Array.isArray(series) || series.length === 0) {
    throw new CleanlinessInputError("Enter the count of at least one extraction.", "series");
  }
  series.forEach((value, i) => {
    if (typeof value !== "number" || !Number.isFinite(value) || value < 0) {
      throw new CleanlinessInputError(
        `Extraction ${i + 1}: the count must be a non-negative finite number (got ${String(value)}).`,
        "series",
      );
    }
  });

  const ratios: number[] = [];
  let total = 0;
  const last = Math.min(series.length, maxExtractions);
  for (let n = 1; n <= last; n++) {
    const current = series[n - 1];
    total += current;
    if (total === 0) {
      throw new CleanlinessInputError(
        `Extractions 1…${n} found no particles, so the decay value is undefined; the declining test needs particles to decline.`,
        "series",
      );
    }
    const ratio = current / total;
    ratios.push(ratio);
    if (ratio <= maxRatio) return { complete: true, step: n, ratios, status: "complete" };
  }
  return {
    complete: false,
    step: null,
    ratios,
    status: series.length >= maxExtractions ? "change-parameters" : "extract-again",
  };
}
