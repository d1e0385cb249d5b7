/** Verified runs on a new version that must pass after closure when the plant has set nothing (issue #13). */
export const DEFAULT_EFFECTIVENESS_RUNS = 3;

export interface EffectivenessRun {
  number: string;
  /** Computed from the raw data by the evidence feature, never typed. */
  outcome: "pass" | "fail" | "incomplete" | null;
  /** When a second person signed it verified (ISO time). */
  verifiedAt: string;
}

export interface EffectivenessResult {
  state: "pending" | "confirmed" | "failed";
  /** Runs that passed among those counted (the k of "k of N"). */
  passed: number;
  required: number;
  /** The run numbers counted, in the order they were verified. */
  counted: string[];
  failedRun: string | null;
}

/**
 * The effectiveness check after a change (issue #13 item 5): the first `required` runs
 * verified on the new version after closure must all pass. The first one that does not
 * (fail, or verified while its outcome is incomplete) fails the check at once; runs
 * verified later do not count. Until `required` have passed it is pending.
 */
export function evaluateEffectiveness(
  required: number,
  runs: readonly EffectivenessRun[],
): EffectivenessResult {
  const ordered = [...runs]
    .sort((a, b) => a.verifiedAt.localeCompare(b.verifiedAt) || a.number.localeCompare(b.number))
    .slice(0, required);
  const counted: string[] = [];
  let passed = 0;
  for (const run of ordered) {
    counted.push(run.number);
    if (run.outcome !== "pass")
      return { state: "failed", passed, required, counted, failedRun: run.number };
    passed++;
  }
  return {
    state: passed >= required ? "confirmed" : "pending",
    passed,
    required,
    counted,
    failedRun: null,
  };
}
