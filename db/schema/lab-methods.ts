import {
  index,
  integer,
  primaryKey,
  sqliteTable,
  text,
  uniqueIndex,
} from "drizzle-orm/sqlite-core";
// Relative: drizzle-kit reads this file without the app's path aliases.
import { LAB_METHOD_KINDS, LAB_METHOD_STATUSES, TRAINING_KINDS } from "../enums";
import { createdAt, id } from "./columns";
import { documents, documentVersions } from "./documents";
import { testRuns } from "./evidence";
import { users } from "./people";

// ── Lab methods ───────────────────────────────────────────────────────────

/**
 * One version of a lab method (extraction, analysis or gravimetric). `code` names the method
 * across its versions; its kind-specific fields are `details`, validated by `labMethodDetailsSchema`.
 * Only an approved version is cited by a run; approving the next one supersedes it.
 */
export const labMethods = sqliteTable(
  "lab_methods",
  {
    id: id(),
    code: text("code").notNull(),
    version: integer("version").notNull(),
    kind: text("kind", { enum: LAB_METHOD_KINDS }).notNull(),
    name: text("name").notNull(),
    details: text("details", { mode: "json" }).notNull().$type<Record<string, unknown>>(),
    /** The run whose declining test qualified an extraction procedure. */
    qualificationRunId: text("qualification_run_id").references(() => testRuns.id),
    /** How long a practical sign-off on this method stays current. */
    trainingIntervalMonths: integer("training_interval_months").notNull().default(24),
    status: text("status", { enum: LAB_METHOD_STATUSES }).notNull().default("draft"),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    approvedBy: text("approved_by").references(() => users.id),
    approvedAt: text("approved_at"),
    supersededAt: text("superseded_at"),
  },
  (t) => [
    uniqueIndex("lab_methods_code_version_uq").on(t.code, t.version),
    index("lab_methods_kind_status_idx").on(t.kind, t.status),
  ],
);
export type LabMethod = typeof labMethods.$inferSelect;

/** The method versions a run revision cites, one per kind; part of the run's content hash. */
export const testRunMethods = sqliteTable(
  "test_run_methods",
  {
    runId: text("run_id")
      .notNull()
      .references(() => testRuns.id),
    kind: text("kind", { enum: LAB_METHOD_KINDS }).notNull(),
    methodId: text("method_id")
      .notNull()
      .references(() => labMethods.id),
  },
  (t) => [
    primaryKey({ columns: [t.runId, t.kind] }),
    index("test_run_methods_method_idx").on(t.methodId),
  ],
);
export type TestRunMethod = typeof testRunMethods.$inferSelect;

// ── Training ──────────────────────────────────────────────────────────────

/**
 * One signed training record: a practical sign-off on a lab method (by its code, any version;
 * signed by the trainer) or a read-and-understood acknowledgement of one procedure version
 * (signed by the person). Current until `expires_on` (exclusive); a later record supersedes it.
 */
export const trainingRecords = sqliteTable(
  "training_records",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    kind: text("kind", { enum: TRAINING_KINDS }).notNull(),
    methodCode: text("method_code"),
    /** The method version the sign-off was given on. */
    methodId: text("method_id").references(() => labMethods.id),
    documentId: text("document_id").references(() => documents.id),
    documentVersionId: text("document_version_id").references(() => documentVersions.id),
    trainedOn: text("trained_on").notNull(),
    expiresOn: text("expires_on").notNull(),
    trainerId: text("trainer_id").references(() => users.id),
    /** The expiry date a reminder was last sent for, so each is sent once. */
    remindedFor: text("reminded_for"),
    createdAt: createdAt(),
  },
  (t) => [
    index("training_records_user_idx").on(t.userId, t.kind),
    index("training_records_method_idx").on(t.methodCode, t.userId),
    index("training_records_expiry_idx").on(t.expiresOn),
  ],
);
export type TrainingRecord = typeof trainingRecords.$inferSelect;
