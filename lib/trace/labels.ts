import type { TimelinePeriod, VersionStatus } from "./timeline";

/** The state of a value, in words: auditors read status, never a colour. */
export function periodStatus(period: Pick<TimelinePeriod, "kind" | "status">): string {
  const labels: Record<VersionStatus, string> = {
    effective: "In force now",
    superseded: "Superseded",
    proposed: "Proposed, not in force",
    withdrawn: "Withdrawn, never in force",
    draft: "Draft, not in force",
  };
  return labels[period.status];
}

export const CHANGE_LABELS: Record<TimelinePeriod["change"], string> = {
  first: "First validated value",
  changed: "Setpoint changed",
  range_changed: "Validated range changed",
  added: "Parameter added",
  removed: "Parameter removed",
  proposed_change: "Change proposed",
};

export const BINDING_LABELS = {
  valid: "Valid",
  invalid: "Invalid: content changed since signing",
  earlier_revision: "On an earlier revision",
} as const;

export const OUTCOME_LABELS: Record<string, string> = {
  pass: "Pass",
  fail: "Fail",
  incomplete: "Incomplete",
};
