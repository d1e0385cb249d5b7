import { z } from "zod";

/** A JSON object as stored in old/new values. */
const jsonObject = z.record(z.string(), z.unknown());

function event<A extends string, R extends string>(action: A, recordType: R) {
  return z.object({
    action: z.literal(action),
    recordType: z.literal(recordType),
    recordId: z.string().min(1),
    old: jsonObject.nullable().default(null),
    new: jsonObject.nullable().default(null),
    reason: z.string().max(4000).nullable().default(null),
  });
}

/**
 * Every kind of event the audit trail records, one schema each.
 * Later features add their events here so the trail stays a closed, typed set.
 */
export const auditEventSchema = z.discriminatedUnion("action", [
  event("auth.signed_in", "user"),
  event("auth.signed_out", "user"),
  event("auth.sign_in_failed", "user"),
  event("auth.locked_out", "user"),
  event("auth.password_changed", "user"),
  event("user.created", "user"),
  event("user.updated", "user"),
  event("user.roles_changed", "user"),
  event("user.deactivated", "user"),
  event("user.reactivated", "user"),
  event("user.password_reset", "user"),
  event("company.set_up", "company"),
  event("site.created", "site"),
  event("system.created", "cleaning_system"),
  event("system.updated", "cleaning_system"),
  event("system.retired", "cleaning_system"),
  event("spec.created", "cleanliness_spec"),
  event("spec.revised", "cleanliness_spec"),
  event("spec.superseded", "cleanliness_spec"),
  event("part_family.created", "part_family"),
  event("part_family.updated", "part_family"),
  event("combination.qualified", "requalification_interval"),
  event("recipe.created", "recipe"),
  event("recipe_version.created", "recipe_version"),
  event("recipe_version.effective", "recipe_version"),
  event("recipe_version.superseded", "recipe_version"),
  event("signature.applied", "signature"),
  event("email.test_sent", "email"),
  event("audit.exported", "audit_trail"),
  event("audit.verified", "audit_trail"),
  // Controlled documents
  event("document.created", "document"),
  event("document.edited", "document_version"),
  event("document.submitted", "document_version"),
  event("document.reviewed", "document_version"),
  event("document.sent_back", "document_version"),
  event("document.approved", "document_version"),
  event("document.rejected", "document_version"),
  event("document.effective", "document_version"),
  event("document.superseded", "document_version"),
  event("document.retired", "document_version"),
  event("document.version_started", "document_version"),
  event("document.review_overdue", "document_review"),
  event("document.exported", "document_version"),
  // Evidence: test runs, their raw data and files, and the bath and filter log
  event("test_run.created", "test_run"),
  event("test_run.result_added", "test_run"),
  event("test_run.result_removed", "test_run"),
  event("test_run.data_saved", "test_run"),
  event("test_run.csv_imported", "test_run"),
  event("test_run.performed", "test_run"),
  event("test_run.verified", "test_run"),
  event("test_run.revised", "test_run"),
  event("test_run.superseded", "test_run"),
  event("evidence_file.uploaded", "evidence_file"),
  event("evidence_file.downloaded", "evidence_file"),
  event("evidence_file.integrity_failed", "evidence_file"),
  event("bath_record.created", "bath_record"),
  event("maintenance_interval.set", "maintenance_interval"),
  event("maintenance.reminder_queued", "maintenance_interval"),
  // Change control
  event("change.opened", "change_request"),
  event("change.proposal_saved", "change_request"),
  event("change.impact_assessed", "change_request"),
  event("change.reopened", "change_request"),
  event("change.approved", "change_request"),
  event("change.requalification_started", "change_request"),
  event("change.evidence_linked", "change_request"),
  event("change.verified", "change_request"),
  event("change.closed", "change_request"),
  event("change.rejected", "change_request"),
  event("change.withdrawn", "change_request"),
  event("recipe_version.proposed", "recipe_version"),
  event("recipe_version.withdrawn", "recipe_version"),
  event("change_narrative.saved", "document_version"),
  event("requalification_matrix.versioned", "requalification_matrix"),
  event("requalification_interval.set", "requalification_interval"),
  event("requalification_interval.reminder_sent", "requalification_interval"),
  // Trace and API
  event("audit_pack.exported", "change_request"),
  event("api_token.created", "api_token"),
  event("api_token.revoked", "api_token"),
]);

export type AuditEventInput = z.input<typeof auditEventSchema>;
export type AuditEvent = z.output<typeof auditEventSchema>;
export type AuditAction = AuditEvent["action"];

/** Who did it: a signed-in user, or the system itself (seeding, scheduled jobs). */
export type AuditActor = { id: string; name: string } | { id: null; name: string };
export const SYSTEM_ACTOR: AuditActor = { id: null, name: "system" };
