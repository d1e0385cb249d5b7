/**
 * Temporary deviations: a planned, time-limited permission to run a recipe outside a parameter's
 * validated range. Pure rules (state, expiry, reminders, ranges); the services store and audit.
 */

export const DEVIATION_STATUSES = ["draft", "approved", "withdrawn", "expired"] as const;
export type DeviationStatus = (typeof DEVIATION_STATUSES)[number];
export const RISK_LEVELS = ["low", "medium", "high"] as const;
export type RiskLevel = (typeof RISK_LEVELS)[number];

/** What a person reads: an approved deviation is "active" until it expires on read or by the job. */
export type DeviationState = "draft" | "active" | "withdrawn" | "expired";
export const DEVIATION_STATE_LABELS: Record<DeviationState, string> = {
  draft: "Draft",
  active: "Active",
  withdrawn: "Withdrawn",
  expired: "Expired",
};
export const RISK_LABELS: Record<RiskLevel, string> = {
  low: "Low",
  medium: "Medium",
  high: "High",
};

export const DEFAULT_REMINDER_DAYS = 3;

export interface DeviationLimits {
  /** Last calendar day (YYYY-MM-DD, UTC) on which the deviation may be used; null when only lots limit it. */
  endsOn: string | null;
  /** How many lots may run under it; null when only the date limits it. */
  maxLots: number | null;
}

export type ExpiryReason = "end_date" | "lots_used";

/**
 * Why an approved deviation no longer covers production on `today`, or null while it does.
 * It covers its end date whole: it expires the day after.
 */
export function expiryReason(
  limits: DeviationLimits,
  today: string,
  lotsUsed: number,
): ExpiryReason | null {
  if (limits.endsOn !== null && today > limits.endsOn) return "end_date";
  if (limits.maxLots !== null && lotsUsed >= limits.maxLots) return "lots_used";
  return null;
}

/** The state shown everywhere, computed on read so an expiry the job has not recorded yet still shows. */
export function deviationState(
  d: DeviationLimits & { status: DeviationStatus },
  today: string,
  lotsUsed: number,
): DeviationState {
  if (d.status === "approved") return expiryReason(d, today, lotsUsed) ? "expired" : "active";
  return d.status;
}

/** Steps a person takes, and the stored statuses each may start from. */
const STEPS = {
  sign_authored: ["draft"],
  approve: ["draft"],
  withdraw: ["draft", "approved"],
  record_lot: ["approved"],
} as const satisfies Record<string, readonly DeviationStatus[]>;
export type DeviationStep = keyof typeof STEPS;

/** Why this step is refused in this state, or null. An approved deviation that has expired takes no step. */
export function stepProblem(step: DeviationStep, state: DeviationState): string | null {
  const stored: DeviationStatus = state === "active" ? "approved" : state;
  if (state === "expired")
    return "This deviation has expired: raise a new one, or a change request to make the values permanent.";
  if (!(STEPS[step] as readonly DeviationStatus[]).includes(stored))
    return `A deviation that is ${DEVIATION_STATE_LABELS[state].toLowerCase()} cannot be ${STEP_WORDS[step]}.`;
  return null;
}
const STEP_WORDS: Record<DeviationStep, string> = {
  sign_authored: "signed by its author",
  approve: "approved",
  withdraw: "withdrawn",
  record_lot: "used for another lot",
};

/** Days from `today` to the end date (0 on the last day), or null with no end date. */
export function daysLeft(endsOn: string | null, today: string): number | null {
  if (endsOn === null) return null;
  return Math.round(
    (Date.parse(`${endsOn}T00:00:00Z`) - Date.parse(`${today}T00:00:00Z`)) / 86_400_000,
  );
}

/** An active deviation's end is close enough to remind its people (once: the service records it). */
export function reminderDue(endsOn: string | null, reminderDays: number, today: string): boolean {
  const left = daysLeft(endsOn, today);
  return left !== null && left >= 0 && left <= reminderDays;
}

export interface TemporaryRange {
  validatedLow: number | null;
  validatedHigh: number | null;
  temporaryLow: number | null;
  temporaryHigh: number | null;
}

/** What is wrong with one parameter's temporary range, by field, so each shows beside its input. */
export function temporaryRangeProblems(
  r: TemporaryRange,
): Partial<Record<"temporaryLow" | "temporaryHigh", string>> {
  if (r.temporaryLow === null && r.temporaryHigh === null)
    return { temporaryLow: "Give the temporary low limit, the high limit or both." };
  if (r.temporaryLow !== null && r.temporaryHigh !== null && r.temporaryLow > r.temporaryHigh)
    return { temporaryHigh: "The high limit must not be below the low limit." };
  // A temporary range inside the validated one (or equal to it) permits nothing new.
  const lowInside =
    r.validatedLow === null ? true : r.temporaryLow !== null && r.temporaryLow >= r.validatedLow;
  const highInside =
    r.validatedHigh === null
      ? true
      : r.temporaryHigh !== null && r.temporaryHigh <= r.validatedHigh;
  if (lowInside && highInside)
    return {
      temporaryLow:
        "This lies inside the validated range already: a deviation is needed only for values outside it.",
    };
  return {};
}

export type Judgement = "within_validated" | "within_temporary" | "outside";

const within = (value: number, low: number | null, high: number | null) =>
  (low === null || value >= low) && (high === null || value <= high);

/**
 * How a recorded value stands: inside the validated range needs nothing; outside it but inside an
 * active deviation's temporary range is permitted by that deviation, and must say so.
 */
export function judgeValue(
  value: number,
  validated: { low: number | null; high: number | null },
  temporary: { low: number | null; high: number | null } | null,
): Judgement {
  if (within(value, validated.low, validated.high)) return "within_validated";
  if (temporary && within(value, temporary.low, temporary.high)) return "within_temporary";
  return "outside";
}

/** A deviation number, DV-YYYY-NNN, the next after the year's highest. */
export function nextDeviationNumber(year: number, existing: readonly string[]): string {
  const prefix = `DV-${year}-`;
  const highest = existing
    .filter((n) => n.startsWith(prefix))
    .map((n) => Number(n.slice(prefix.length)))
    .filter(Number.isFinite)
    .reduce((a, b) => Math.max(a, b), 0);
  return `${prefix}${String(highest + 1).padStart(3, "0")}`;
}
