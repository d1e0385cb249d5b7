import { CHANGE_KINDS, type CHANGE_STATUSES } from "@/db/enums";
import type { Permission } from "@/lib/auth/permissions";

export type ChangeStatus = (typeof CHANGE_STATUSES)[number];
export type ChangeStep =
  | "assess"
  | "reopen"
  | "approve"
  | "start_requalification"
  | "verify"
  | "close"
  | "reject"
  | "withdraw";

export const OPEN_STATUSES: ChangeStatus[] = [
  "draft",
  "impact_assessed",
  "approved_for_implementation",
  "requalification",
  "verified",
];

/**
 * The change-request lifecycle (product.md): draft → impact assessed → approved
 * for implementation → requalification → verified → closed, or rejected /
 * withdrawn from any open step. A change with no required tests goes from
 * approval straight to verification. Enforced on the server (21 CFR 11.10(f)).
 */
export const CHANGE_STEPS: Record<
  ChangeStep,
  { from: ChangeStatus[]; to: ChangeStatus; permission: Permission; label: string }
> = {
  assess: {
    from: ["draft"],
    to: "impact_assessed",
    permission: "change.draft",
    label: "Submit impact assessment",
  },
  reopen: {
    from: ["impact_assessed"],
    to: "draft",
    permission: "change.draft",
    label: "Reopen for editing",
  },
  approve: {
    from: ["impact_assessed"],
    to: "approved_for_implementation",
    permission: "change.approve",
    label: "Approve for implementation",
  },
  start_requalification: {
    from: ["approved_for_implementation"],
    to: "requalification",
    permission: "change.draft",
    label: "Start requalification",
  },
  verify: {
    from: ["approved_for_implementation", "requalification"],
    to: "verified",
    permission: "change.verify",
    label: "Verify",
  },
  close: {
    from: ["verified"],
    to: "closed",
    permission: "recipe.make_effective",
    label: "Close and make effective",
  },
  reject: { from: OPEN_STATUSES, to: "rejected", permission: "change.approve", label: "Reject" },
  withdraw: { from: OPEN_STATUSES, to: "withdrawn", permission: "change.draft", label: "Withdraw" },
};

/** Why a step may not be taken from this status with this many required tests, or null when it may. */
export function stepProblem(
  step: ChangeStep,
  status: ChangeStatus,
  requiredTests: number,
): string | null {
  const rule = CHANGE_STEPS[step];
  if (step === "close" && status === "requalification")
    return "Verify the change first: a second person signs it verified, and only then is it closed and made effective.";
  if (!rule.from.includes(status))
    return `A change request that is ${CHANGE_STATUS_LABELS[status].toLowerCase()} cannot be ${STEP_PAST[step]}.`;
  if (step === "start_requalification" && requiredTests === 0)
    return "This change calls for no requalification tests: verify it directly.";
  if (step === "verify" && status === "approved_for_implementation" && requiredTests > 0)
    return "Start requalification first: this change calls for tests.";
  return null;
}

/**
 * Whether the change page offers a step: the lifecycle allows it and, for Verify, the
 * evidence exists. A button that can only be refused is not offered; the page says
 * what it waits for instead (waitingFor).
 */
export function stepOffered(
  step: ChangeStep,
  status: ChangeStatus,
  requiredTests: number,
  gateHolds: boolean,
): boolean {
  if (stepProblem(step, status, requiredTests) !== null) return false;
  if (step === "verify" && requiredTests > 0 && !gateHolds) return false;
  return true;
}

/** What Verify and Close wait for while the change is being requalified, or null when nothing. */
export function waitingFor(
  status: ChangeStatus,
  requiredTests: number,
  gate: { holds: boolean; missing: string[] },
): { summary: string; missing: string[] } | null {
  if (status !== "requalification" || requiredTests === 0) return null;
  if (!gate.holds)
    return {
      summary:
        "Verify and Close and make effective wait for the requalification evidence. Still missing:",
      missing: gate.missing,
    };
  return {
    summary:
      "The evidence is complete. Next a second person signs the change verified; only then is it closed and made effective.",
    missing: [],
  };
}

const STEP_PAST: Record<ChangeStep, string> = {
  assess: "submitted for approval",
  reopen: "reopened",
  approve: "approved",
  start_requalification: "moved to requalification",
  verify: "verified",
  close: "closed",
  reject: "rejected",
  withdraw: "withdrawn",
};

export const CHANGE_STATUS_LABELS: Record<ChangeStatus, string> = {
  draft: "Draft",
  impact_assessed: "Impact assessed",
  approved_for_implementation: "Approved for implementation",
  requalification: "Requalification",
  verified: "Verified",
  closed: "Closed",
  rejected: "Rejected",
  withdrawn: "Withdrawn",
};

export { CHANGE_KINDS };
export type ChangeKind = (typeof CHANGE_KINDS)[number];
export const CHANGE_KIND_LABELS: Record<ChangeKind, string> = {
  parameter_change: "Parameter change",
  new_detergent: "New detergent",
  new_part_family: "New part family on the recipe",
  maintenance_interval: "Maintenance-interval change",
  equipment: "Equipment change on the cleaning system",
  initial_validation: "Initial validation of a new recipe",
  specification: "Customer specification revised",
};

/** Kinds that qualify the recipe for a part family named on the change request. */
export function addsPartFamily(kind: ChangeKind): boolean {
  return kind === "new_part_family" || kind === "initial_validation";
}

/**
 * Kinds opened from the record that changed, which carries the diff: an initial validation from
 * the recipe's draft, an equipment change from the washer's editor, a specification change from
 * the revised specification.
 */
export const OPENED_ELSEWHERE: readonly ChangeKind[] = [
  "initial_validation",
  "equipment",
  "specification",
];

/** Kinds an engineer may open against an effective version (an initial validation is opened on a new recipe's draft). */
export const CHANGE_KINDS_FOR_EFFECTIVE = CHANGE_KINDS.filter((k) => !OPENED_ELSEWHERE.includes(k));
