import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { id } from "./columns";
import { changeRequests } from "./changes";
import { documents } from "./documents";
import { users } from "./people";
import { signatures } from "./audit";
import { evidenceFiles } from "./evidence";
import { cleanlinessSpecs } from "./parts";

// ── Change control: emergency changes, effectiveness checks, affected documents ──

/**
 * The plant's change-control settings, one row (the fixed id makes a second row a
 * primary-key clash). Absent until an administrator first saves: the defaults apply.
 */
export const changeControlSettings = sqliteTable("change_control_settings", {
  id: text("id")
    .primaryKey()
    .$defaultFn(() => "change_control"),
  /** Days an emergency change may run in force before its approval. */
  emergencyApprovalDays: integer("emergency_approval_days").notNull().default(3),
  /** Verified runs on a new version that must pass after closure. */
  effectivenessRuns: integer("effectiveness_runs").notNull().default(3),
  updatedBy: text("updated_by").references(() => users.id),
  updatedAt: text("updated_at"),
});
export type ChangeControlSettings = typeof changeControlSettings.$inferSelect;

/** A change implemented before approval: who signed it into force, why, and by when approval must follow. */
export const emergencyChanges = sqliteTable("emergency_changes", {
  changeRequestId: text("change_request_id")
    .primaryKey()
    .references(() => changeRequests.id),
  justification: text("justification").notNull(),
  implementedBy: text("implemented_by")
    .notNull()
    .references(() => users.id),
  implementedAt: text("implemented_at").notNull(),
  /** Calendar date (YYYY-MM-DD) by which an approver must have signed. */
  approvalDueOn: text("approval_due_on").notNull(),
  signatureId: text("signature_id")
    .notNull()
    .references(() => signatures.id),
  /** When the overdue approval was escalated; set once, so the escalation goes out once. */
  escalatedAt: text("escalated_at"),
});
export type EmergencyChange = typeof emergencyChanges.$inferSelect;

/** After closure, the first N verified runs on the new version must pass. */
export const changeEffectivenessChecks = sqliteTable(
  "change_effectiveness_checks",
  {
    changeRequestId: text("change_request_id")
      .primaryKey()
      .references(() => changeRequests.id),
    requiredRuns: integer("required_runs").notNull(),
    /** Runs verified from this instant on count (the closure). */
    countsFrom: text("counts_from").notNull(),
    /** Recorded once the computation decides; null while pending. */
    outcome: text("outcome", { enum: ["confirmed", "failed"] }),
    decidedAt: text("decided_at"),
    /** The run numbers the decision rests on, in order. */
    runs: text("runs", { mode: "json" }).$type<string[]>(),
  },
  (t) => [index("change_effectiveness_pending_idx").on(t.outcome)],
);
export type ChangeEffectivenessCheck = typeof changeEffectivenessChecks.$inferSelect;

/** A controlled document a change request touches: revised through the document workflow, or confirmed unaffected. */
export const changeAffectedDocuments = sqliteTable(
  "change_affected_documents",
  {
    id: id(),
    changeRequestId: text("change_request_id")
      .notNull()
      .references(() => changeRequests.id),
    documentId: text("document_id")
      .notNull()
      .references(() => documents.id),
    addedBy: text("added_by")
      .notNull()
      .references(() => users.id),
    addedAt: text("added_at").notNull(),
    unaffectedReason: text("unaffected_reason"),
    confirmedBy: text("confirmed_by").references(() => users.id),
    confirmedAt: text("confirmed_at"),
  },
  (t) => [uniqueIndex("change_affected_documents_uq").on(t.changeRequestId, t.documentId)],
);
export type ChangeAffectedDocument = typeof changeAffectedDocuments.$inferSelect;

/**
 * The customer's recorded decision on a change, for one specification revision that says the
 * customer must approve process changes. The latest record for a specification counts; earlier
 * ones stay as history (a rejection, then an approval of the reworked change).
 */
export const changeCustomerDecisions = sqliteTable(
  "change_customer_decisions",
  {
    id: id(),
    changeRequestId: text("change_request_id")
      .notNull()
      .references(() => changeRequests.id),
    specId: text("spec_id")
      .notNull()
      .references(() => cleanlinessSpecs.id),
    decision: text("decision", { enum: ["approved", "rejected"] }).notNull(),
    /** Calendar date (YYYY-MM-DD) of the customer's letter. */
    decidedOn: text("decided_on").notNull(),
    /** The customer's reference for the decision (letter or deviation number). */
    reference: text("reference").notNull(),
    letterFileId: text("letter_file_id")
      .notNull()
      .references(() => evidenceFiles.id),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => users.id),
    recordedAt: text("recorded_at").notNull(),
  },
  (t) => [index("change_customer_decisions_change_idx").on(t.changeRequestId)],
);
export type ChangeCustomerDecision = typeof changeCustomerDecisions.$inferSelect;
