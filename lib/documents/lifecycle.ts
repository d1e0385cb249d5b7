import type { DocumentStatus, DocumentType, Role } from "@/db/enums";
import { can, type Permission } from "@/lib/auth/permissions";

/**
 * The permitted sequence of steps for a controlled document (21 CFR 11.10(f)):
 * draft → in review → approved → effective → superseded / retired; sending
 * back or rejecting returns to draft; a new version starts from an approved or
 * effective one. Supersession is never a user's action: it follows when the
 * next version becomes effective.
 */
export const DOCUMENT_ACTIONS = [
  "edit",
  "submit",
  "review",
  "send_back",
  "approve",
  "reject",
  "make_effective",
  "new_version",
  "retire",
] as const;
export type DocumentAction = (typeof DOCUMENT_ACTIONS)[number];

interface Rule {
  from: readonly DocumentStatus[];
  /** The version's status afterwards; null when the action starts a new version instead. */
  to: DocumentStatus | null;
  permission: Permission;
}

export const DOCUMENT_RULES: Record<DocumentAction, Rule> = {
  edit: { from: ["draft"], to: "draft", permission: "document.draft" },
  submit: { from: ["draft"], to: "in_review", permission: "document.submit" },
  review: { from: ["in_review"], to: "in_review", permission: "document.review" },
  send_back: { from: ["in_review"], to: "draft", permission: "document.review" },
  approve: { from: ["in_review"], to: "approved", permission: "document.approve" },
  reject: { from: ["in_review"], to: "draft", permission: "document.approve" },
  make_effective: { from: ["approved"], to: "effective", permission: "document.approve" },
  new_version: { from: ["approved", "effective"], to: null, permission: "document.draft" },
  retire: { from: ["effective"], to: "retired", permission: "document.approve" },
};

export const DOCUMENT_STATUS_LABELS: Record<DocumentStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  effective: "Effective",
  superseded: "Superseded",
  retired: "Retired",
};

const ACTION_WORDS: Record<DocumentAction, string> = {
  edit: "edited",
  submit: "submitted for review",
  review: "signed as reviewed",
  send_back: "sent back",
  approve: "approved",
  reject: "rejected",
  make_effective: "made effective",
  new_version: "revised as a new version",
  retire: "retired",
};

export type TransitionCheck =
  { ok: true; to: DocumentStatus | null } | { ok: false; reason: string };

export const NARRATIVE_MOVES_WITH_CHANGE =
  "A change narrative moves only with its change request: submit, approve or close the change request, and its narrative follows.";

/**
 * Whether a person with these roles may take this action on a version in this status. A change
 * narrative's status is set by its change request (lib/server/changes/narrative-status.ts), so the
 * document workflow only lets its draft be edited; a narrative approved or made effective on its own
 * would claim an approval the change never had.
 */
export function checkTransition(
  status: DocumentStatus,
  action: DocumentAction,
  roles: readonly Role[],
  type?: DocumentType,
): TransitionCheck {
  const rule = DOCUMENT_RULES[action];
  if (!can(roles, rule.permission)) return { ok: false, reason: "Your role does not allow this." };
  if (type === "change_narrative" && action !== "edit")
    return { ok: false, reason: NARRATIVE_MOVES_WITH_CHANGE };
  if (!rule.from.includes(status)) {
    return {
      ok: false,
      reason: `A version that is ${DOCUMENT_STATUS_LABELS[status].toLowerCase()} cannot be ${ACTION_WORDS[action]}.`,
    };
  }
  return { ok: true, to: rule.to };
}

export const TYPE_LABELS: Record<DocumentType, string> = {
  iq_protocol: "IQ protocol",
  oq_protocol: "OQ protocol",
  pq_protocol: "PQ protocol",
  report: "Validation report",
  procedure: "Procedure",
  change_narrative: "Change narrative",
};

const TYPE_PREFIX: Record<DocumentType, string> = {
  iq_protocol: "IQ",
  oq_protocol: "OQ",
  pq_protocol: "PQ",
  report: "VR",
  procedure: "SOP",
  change_narrative: "CN",
};

/** Our numbering: type prefix, cleaning-system code without punctuation, four-digit sequence: PQ-AW3-0001. */
export function numberPrefix(type: DocumentType, systemCode: string | null): string {
  const system = systemCode ? systemCode.replace(/[^A-Za-z0-9]/g, "").toUpperCase() : "GEN";
  return `${TYPE_PREFIX[type]}-${system}-`;
}

export function documentNumber(
  type: DocumentType,
  systemCode: string | null,
  sequence: number,
): string {
  return `${numberPrefix(type, systemCode)}${String(sequence).padStart(4, "0")}`;
}
