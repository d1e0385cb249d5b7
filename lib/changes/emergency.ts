import { todayUtc } from "@/lib/format/date";
import type { ChangeStatus } from "./workflow";

/** Days an emergency change may stay in force unapproved when the plant has set nothing (issue #13). */
export const DEFAULT_EMERGENCY_APPROVAL_DAYS = 3;

/** The calendar date `days` after `date` (both YYYY-MM-DD, counted in UTC). */
export function addDays(date: string, days: number): string {
  const d = new Date(`${date}T00:00:00.000Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return todayUtc(d);
}

/** The latest approval deadline an engineer may set when implementing today. */
export function latestApprovalDue(today: string, days: number): string {
  return addDays(today, days);
}

/** Why this approval deadline is refused, or null: not in the past, and not later than the plant allows. */
export function approvalDueProblem(dueOn: string, today: string, days: number): string | null {
  if (dueOn < today) return `The approval deadline cannot be in the past (today is ${today}).`;
  const latest = latestApprovalDue(today, days);
  if (dueOn > latest)
    return `Approval must follow within ${days} day${days === 1 ? "" : "s"}: set ${latest} or earlier.`;
  return null;
}

/** Statuses in which the approver has signed the change (it left "impact assessed" forwards). */
const APPROVED: ChangeStatus[] = [
  "approved_for_implementation",
  "requalification",
  "verified",
  "closed",
];

export type EmergencyApprovalState = "approved" | "awaiting" | "overdue" | "ended";

/**
 * Where the approval of an emergency change stands: awaiting until the end of its due
 * date, overdue from the next day on, approved once an approver signed, ended when it
 * was rejected or withdrawn (the previous version is back in force).
 */
export function emergencyApprovalState(input: {
  status: ChangeStatus;
  approvalDueOn: string;
  today: string;
}): EmergencyApprovalState {
  if (APPROVED.includes(input.status)) return "approved";
  if (input.status === "rejected" || input.status === "withdrawn") return "ended";
  return input.today > input.approvalDueOn ? "overdue" : "awaiting";
}

/** An overdue approval is escalated once: a second pass finds it marked and sends nothing. */
export function needsEscalation(input: {
  status: ChangeStatus;
  approvalDueOn: string;
  today: string;
  escalatedAt: string | null;
}): boolean {
  return emergencyApprovalState(input) === "overdue" && input.escalatedAt === null;
}

/** The word "Emergency" stays on the change everywhere until it is closed (or ended). */
export function showsEmergency(status: ChangeStatus): boolean {
  return status !== "closed" && status !== "rejected" && status !== "withdrawn";
}
