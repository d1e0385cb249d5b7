import type { Outcome, TestType } from "@/db/enums";
import { formatNumber } from "@/lib/format/number";

/** What each test type's evaluation reads: the stored rows of one run and the limits that apply to it. */

export interface SpecForOutcome {
  ccc: string;
  maxMetallicUm: number | null;
  maxNonMetallicUm: number | null;
  maxFibreUm: number | null;
  gravimetricLimitMg: number | null;
  gravimetricBasis: "per_component" | "per_1000_cm2" | null;
  minWettingTensionMNm: number | null;
}

export interface OutcomeInput {
  testType: TestType;
  family: { wettedAreaCm2: number; wettedVolumeCm3: number | null };
  spec: SpecForOutcome;
  /** The recipe version's final-rinse conductivity limit in µS/cm, when it sets one. */
  conductivityLimitUsPerCm: number | null;
  samples: { sampleLabel: string; worstCase: boolean; data: unknown }[];
  runData: unknown;
  /**
   * The analysis's lower size limit in µm, when the run records its lab details: classes below it
   * were not analysed and never appear in the code. Null: the classes from the smallest one counted.
   */
  lowerSizeLimitUm?: number | null;
  /** Photos attached to the run (visual, UV and dryness need at least one). */
  photoCount: number;
}

/**
 * What a check is about, which decides what its failure means:
 * - "measurement": it qualifies the measurement itself (blank value, extraction). A failure means
 *   the numbers cannot be trusted yet, so the run is incomplete, not failed.
 * - "acceptance": it is part of accepting the parts. A failure fails the run.
 */
export type CheckKind = "measurement" | "acceptance";

/** pass/fail, or null when the check could not be made (it makes the run incomplete). */
export interface Check {
  kind: CheckKind;
  title: string;
  pass: boolean | null;
  lines: string[];
  /**
   * false when nothing was measured for this check and it is accepted on other grounds (an
   * extraction procedure qualified elsewhere): it does not hold the run back, but it is shown as
   * "not recorded", never as a pass nobody measured.
   */
  recorded?: false;
}

/** The word a check is shown with: a check with no data is "not recorded", whatever it lets through. */
export function checkWord(
  check: Pick<Check, "pass" | "recorded">,
): "pass" | "fail" | "incomplete" | "not recorded" {
  if (check.recorded === false) return "not recorded";
  return check.pass === null ? "incomplete" : check.pass ? "pass" : "fail";
}

export interface SampleOutcome {
  sampleLabel: string;
  worstCase: boolean;
  outcome: Outcome;
  /** The sample's cleanliness code (particle tests). */
  code?: string;
  lines: string[];
}

export interface RunOutcome {
  outcome: Outcome;
  /** The run's cleanliness code over all samples together (particle tests). */
  code: string | null;
  basisUnit: string | null;
  samples: SampleOutcome[];
  checks: Check[];
  /** Why the outcome is incomplete, in words. */
  missing: string[];
}

export const fmt = (n: number, digits = 1) => formatNumber(n, digits);
export const word = (pass: boolean) => (pass ? "pass" : "fail");

/**
 * The run's word from its parts: no samples, anything missing, a check not made or a measurement
 * not qualified → incomplete; then any failing sample or acceptance check → fail.
 */
export function combineOutcome(
  samples: SampleOutcome[],
  checks: Check[],
  missing: string[],
): Outcome {
  if (samples.length === 0) return "incomplete";
  if (
    missing.length > 0 ||
    checks.some((c) => c.pass === null || (c.pass === false && c.kind === "measurement"))
  )
    return "incomplete";
  if (samples.some((s) => s.outcome === "incomplete")) return "incomplete";
  if (samples.some((s) => s.outcome === "fail") || checks.some((c) => c.pass === false))
    return "fail";
  return "pass";
}

/** Stored rows were validated by the entry schema when written; the computations check their inputs again. */
export function parsedSamples<T>(
  input: Pick<OutcomeInput, "samples">,
): { label: string; worstCase: boolean; data: T }[] {
  return input.samples.map((s) => ({
    label: s.sampleLabel,
    worstCase: s.worstCase,
    data: s.data as T,
  }));
}

/** A run outcome with no cleanliness code, as every test type but the particle test gives. */
export function plainOutcome(
  samples: SampleOutcome[],
  checks: Check[],
  missing: string[],
): RunOutcome {
  return {
    outcome: combineOutcome(samples, checks, missing),
    code: null,
    basisUnit: null,
    samples,
    checks,
    missing,
  };
}
