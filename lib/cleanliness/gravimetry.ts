import { CleanlinessInputError } from "./errors";
import { formatCount, formatPercent } from "./format";
import { requireNonNegative, requirePositive, requirePositiveInteger } from "./validate";

export type GravimetryInput = {
  filterBeforeMg: number;
  filterAfterMg: number;
  /** Residue of the blank analysis on its own filter, in mg. */
  blankMg?: number;
  /** Components whose extraction liquid went through the filter. */
  components: number;
  /** Their total wetted (tested) area, for a result per 1000 cm². */
  totalAreaCm2?: number;
};

export type GravimetryResult = {
  /** Filter mass after − before, in mg. */
  residueMg: number;
  perComponentMg: number;
  /** Residue per 1000 cm² of tested area, or null without an area. */
  per1000Cm2Mg: number | null;
  /** The residue is below the ~1 mg lower limit of meaningful results. */
  belowPracticalLimit: boolean;
  /** Blank residue ≤ 10 % of the residue mass; null without a blank. */
  blankOk: boolean | null;
  /** Blank as a fraction of the residue; null without a blank or with no residue. */
  blankFraction: number | null;
  notes: string[];
};

/** [std] ISO 16232 gravimetry: results below about 1 mg are not meaningful without a controlled room climate. */
export const GRAVIMETRY_PRACTICAL_LIMIT_MG = 1;
/** [std] VDA 19.1:2015: gravimetric blank ≤ 10 % of the residue mass. */
export const GRAVIMETRY_BLANK_MAX_FRACTION = 0.1;

/**
 * Gravimetric residue [std, ISO 16232]: residue = filter mass after − before, in mg, per component
 * and — by the same normalisation as particle counts [memory] — per 1000 cm². The blank is not
 * subtracted; it qualifies the measurement when it is at most 10 % of the residue.
 */
export function gravimetricResidue(input: GravimetryInput): GravimetryResult {
  const before = requireNonNegative(
    input.filterBeforeMg,
    "Filter mass before (mg)",
    "filterBeforeMg",
  );
  const after = requireNonNegative(input.filterAfterMg, "Filter mass after (mg)", "filterAfterMg");
  const components = requirePositiveInteger(input.components, "Number of components", "components");
  if (after < before) {
    throw new CleanlinessInputError(
      `The filter is lighter after filtration (${after} mg) than before (${before} mg); check the weighing.`,
      "filterAfterMg",
    );
  }
  // Subtracting two balance readings leaves binary noise (100.8 − 100 = 0.79999…); no balance
  // resolves a nanogram, so the difference is rounded to 1e-6 mg.
  const residueMg = Math.round((after - before) * 1e6) / 1e6;
  const area =
    input.totalAreaCm2 === undefined
      ? null
      : requirePositive(input.totalAreaCm2, "Total tested area (cm²)", "totalAreaCm2");
  const notes: string[] = [];

  const belowPracticalLimit = residueMg < GRAVIMETRY_PRACTICAL_LIMIT_MG;
  if (belowPracticalLimit) {
    notes.push(
      `Residue ${formatCount(residueMg)} mg is below the practical limit of ${GRAVIMETRY_PRACTICAL_LIMIT_MG} mg: filter more components together or weigh in a controlled climate.`,
    );
  }

  let blankOk: boolean | null = null;
  let blankFraction: number | null = null;
  if (input.blankMg !== undefined) {
    const blankMg = requireNonNegative(input.blankMg, "Blank residue (mg)", "blankMg");
    blankOk = blankMg <= GRAVIMETRY_BLANK_MAX_FRACTION * residueMg;
    blankFraction = residueMg > 0 ? blankMg / residueMg : null;
    notes.push(
      blankFraction === null
        ? `Blank ${formatCount(blankMg)} mg against no residue: ${blankOk ? "pass" : "fail"}.`
        : `Blank ${formatCount(blankMg)} mg is ${formatPercent(blankFraction)} of the residue (allowed ≤ 10 %): ${blankOk ? "pass" : "fail"}.`,
    );
  }

  return {
    residueMg,
    perComponentMg: residueMg / components,
    per1000Cm2Mg: area === null ? null : (residueMg * 1000) / area,
    belowPracticalLimit,
    blankOk,
    blankFraction,
    notes,
  };
}
