import { formatDate } from "@/lib/format/date";
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

/**
 * Where a value that came in without a change request came from, in words: when it took force
 * (its effective date) comes first, because an auditor asks what was in force when; the day it
 * was typed into Washproof is bookkeeping and says so.
 */
export function uncontrolledOrigin(input: {
  firstVersion: boolean;
  effectiveFrom: string | null;
  author: string | null;
  enteredAt: string;
}): string {
  const what = input.firstVersion
    ? "the recipe's first validated version"
    : "a version recorded without change control";
  const force = input.effectiveFrom
    ? `took force on ${formatDate(input.effectiveFrom)}`
    : "never took force";
  const entered = `entered in Washproof${input.author ? ` by ${input.author}` : ""} on ${formatDate(input.enteredAt)}`;
  return `No change request: ${what}, ${force} (${entered}).`;
}
