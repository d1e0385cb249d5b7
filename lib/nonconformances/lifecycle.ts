import type {
  NC_ACTION_STATUSES,
  NC_CAUSE_METHODS,
  NC_DISPOSITIONS,
  NC_HOLD_STATES,
  NC_MANUAL_KINDS,
  NC_SEVERITIES,
  NC_SOURCE_KINDS,
  NC_STATUSES,
} from "@/db/enums";

export type NcStatus = (typeof NC_STATUSES)[number];

export const NC_STATUS_LABELS: Record<NcStatus, string> = {
  open: "Open",
  contained: "Contained",
  cause_found: "Cause found",
  actions_under_way: "Actions under way",
  effectiveness_check: "Effectiveness check",
  closed: "Closed",
  cancelled: "Cancelled",
};
export const NC_SEVERITY_LABELS: Record<(typeof NC_SEVERITIES)[number], string> = {
  minor: "Minor",
  major: "Major",
  critical: "Critical",
};
export const NC_SOURCE_LABELS: Record<(typeof NC_SOURCE_KINDS)[number], string> = {
  run: "Test run verified as Fail",
  bath_reading: "Bath or rinse reading beyond its reject limit",
  cycle: "Wash cycle outside its validated range",
  calibration: "Instrument used past its calibration due date",
  change_effectiveness: "Change effectiveness check failed",
  manual: "Reported by hand",
};
export const NC_MANUAL_LABELS: Record<(typeof NC_MANUAL_KINDS)[number], string> = {
  customer_complaint: "Customer complaint",
  field_return: "Field return",
  audit_finding: "Audit finding",
};
export const NC_HOLD_LABELS: Record<(typeof NC_HOLD_STATES)[number], string> = {
  pending: "Not yet decided",
  held: "Held",
  released: "Released",
};
export const NC_DISPOSITION_LABELS: Record<(typeof NC_DISPOSITIONS)[number], string> = {
  reclean: "Re-clean and retest",
  use_as_is: "Use as is (customer concession)",
  scrap: "Scrap",
};
export const NC_METHOD_LABELS: Record<(typeof NC_CAUSE_METHODS)[number], string> = {
  five_whys: "Five whys",
  cause_and_effect: "Cause-and-effect (fishbone)",
  other: "Other",
};
export const NC_ACTION_STATUS_LABELS: Record<(typeof NC_ACTION_STATUSES)[number], string> = {
  open: "Open",
  in_progress: "In progress",
  done: "Done",
};

/** A nonconformance that nobody works any more. */
export const NC_FINISHED: readonly NcStatus[] = ["closed", "cancelled"];

/** What the stored record says, as far as the next step cares. */
export interface NcFacts {
  /** Containment items whose hold is still pending. */
  undecidedItems: number;
  /** Held items with no disposition yet. */
  heldWithoutDisposition: number;
  hasRootCause: boolean;
  actions: number;
  openActions: number;
  hasEffectivenessPlan: boolean;
  effectiveness: "confirmed" | "not_effective" | null;
  hasEffectivenessEvidence: boolean;
}

/** The step forward from each status, and the one facts-check it needs. */
const FORWARD: Partial<Record<NcStatus, NcStatus>> = {
  open: "contained",
  contained: "cause_found",
  cause_found: "actions_under_way",
  actions_under_way: "effectiveness_check",
  effectiveness_check: "closed",
};

/**
 * Why the nonconformance may not move from `from` to `to`, or null when it may. Steps go
 * forward one at a time; an effectiveness check that found the actions did not work sends it
 * back to actions; any unfinished one may be cancelled (the reason is checked by the service).
 */
export function transitionProblem(from: NcStatus, to: NcStatus, f: NcFacts): string | null {
  if (NC_FINISHED.includes(from))
    return `This nonconformance is ${NC_STATUS_LABELS[from].toLowerCase()}; nothing more can be done to it.`;
  if (to === "cancelled") return null;
  if (from === "effectiveness_check" && to === "actions_under_way")
    return f.effectiveness === "not_effective"
      ? null
      : "Go back to actions only when the effectiveness check found they did not work.";
  if (FORWARD[from] !== to)
    return `A nonconformance that is ${NC_STATUS_LABELS[from].toLowerCase()} cannot move to "${NC_STATUS_LABELS[to]}".`;
  switch (to) {
    case "contained":
      return f.undecidedItems > 0
        ? `Mark each affected item held or released first: ${f.undecidedItems} still undecided.`
        : null;
    case "cause_found":
      return f.hasRootCause ? null : "Record the root cause and the method used first.";
    case "actions_under_way":
      return f.actions > 0 ? null : "Add at least one corrective or preventive action first.";
    case "effectiveness_check":
      if (f.openActions > 0)
        return `Finish the actions first: ${f.openActions} ${f.openActions === 1 ? "is" : "are"} still open.`;
      return f.hasEffectivenessPlan
        ? null
        : "Set the effectiveness check's criterion and due date first.";
    case "closed":
      return closureProblem(f);
    default:
      return null;
  }
}

/** Why it cannot be closed (signed for closure), or null. */
export function closureProblem(f: NcFacts): string | null {
  if (f.openActions > 0)
    return `Cannot close with open actions: ${f.openActions} ${f.openActions === 1 ? "is" : "are"} not done.`;
  if (f.heldWithoutDisposition > 0)
    return `Record a disposition for every held item first: ${f.heldWithoutDisposition} without one.`;
  if (f.effectiveness !== "confirmed" || !f.hasEffectivenessEvidence)
    return "Close only after the effectiveness check is confirmed with evidence.";
  return null;
}

/** Working steps a person takes from the page, in order. */
export const NEXT_STEP_LABELS: Partial<Record<NcStatus, string>> = {
  open: "Confirm containment",
  contained: "Confirm the root cause",
  cause_found: "Start the actions",
  actions_under_way: "Start the effectiveness check",
};
