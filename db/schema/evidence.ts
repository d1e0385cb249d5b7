import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { sql } from "drizzle-orm";
import { TEST_TYPES, RUN_STATUSES, OUTCOMES, EVIDENCE_FILE_KINDS } from "../enums";
import { bool, createdAt, id } from "./columns";
import { changeRequests } from "./changes";
import { documents } from "./documents";
import { cleanlinessSpecs, partFamilies } from "./parts";
import { users } from "./people";
import { recipeVersions } from "./recipes";

// ── Evidence ──────────────────────────────────────────────────────────────

export const testRuns = sqliteTable(
  "test_runs",
  {
    id: id(),
    /** Shared by every revision of a run; (number, revision) is unique. */
    number: text("number").notNull(),
    partFamilyId: text("part_family_id")
      .notNull()
      .references(() => partFamilies.id),
    recipeVersionId: text("recipe_version_id")
      .notNull()
      .references(() => recipeVersions.id),
    /** The specification revision in force when the run was opened: a later revision never re-judges it. */
    specId: text("spec_id").references(() => cleanlinessSpecs.id),
    changeRequestId: text("change_request_id").references(() => changeRequests.id),
    protocolDocumentId: text("protocol_document_id").references(() => documents.id),
    testType: text("test_type", { enum: TEST_TYPES }).notNull(),
    status: text("status", { enum: RUN_STATUSES }).notNull().default("open"),
    /** Computed from the stored samples, never typed. */
    outcome: text("outcome", { enum: OUTCOMES }),
    revision: integer("revision").notNull().default(1),
    supersedesId: text("supersedes_id"),
    /** Why this revision replaced the one before (a correction). */
    revisionReason: text("revision_reason"),
    /** The change request's requirement this run answers, e.g. "particle_cleanliness". */
    requirement: text("requirement"),
    /** Run-level raw data (extraction series, blank), validated per test type. */
    runData: text("run_data", { mode: "json" }).$type<Record<string, unknown>>(),
    technicianId: text("technician_id").references(() => users.id),
    lab: text("lab"),
    performedOn: text("performed_on"),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("test_runs_number_revision_uq").on(t.number, t.revision),
    index("test_runs_family_idx").on(t.partFamilyId),
    // The plant overview reads each part family's newest verified runs.
    index("test_runs_family_status_idx").on(t.partFamilyId, t.status, t.performedOn),
    index("test_runs_recipe_version_idx").on(t.recipeVersionId),
    index("test_runs_change_idx").on(t.changeRequestId),
    // My queue reads the open and performed runs; the evidence table pages newest first.
    index("test_runs_status_idx").on(t.status),
    index("test_runs_performed_on_idx").on(t.performedOn, t.number, t.revision),
  ],
);
export type TestRun = typeof testRuns.$inferSelect;

/** Raw data of one sample of a run; `data` is validated per test type. */
export const testSamples = sqliteTable(
  "test_samples",
  {
    id: id(),
    runId: text("run_id")
      .notNull()
      .references(() => testRuns.id),
    sampleLabel: text("sample_label").notNull(),
    /** The washer's cycle id the part came out of, as written on the sample (a wash cycle's number on the run's washer). */
    cycleNumber: text("cycle_number"),
    basketPosition: text("basket_position"),
    worstCase: bool("worst_case").notNull().default(false),
    data: text("data", { mode: "json" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [
    index("test_samples_run_idx").on(t.runId),
    // The lot history finds the runs whose parts came out of a lot's cycles. Partial: most samples
    // name no cycle, and a full index's statistics then tell the planner a cycle id matches them all.
    index("test_samples_cycle_idx")
      .on(t.cycleNumber)
      .where(sql`${t.cycleNumber} is not null`),
  ],
);
export type TestSample = typeof testSamples.$inferSelect;

export const evidenceFiles = sqliteTable(
  "evidence_files",
  {
    id: id(),
    runId: text("run_id").references(() => testRuns.id),
    /** Content address: the bytes are stored once under this hash. */
    sha256: text("sha256").notNull(),
    originalName: text("original_name").notNull(),
    mimeType: text("mime_type").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    kind: text("kind", { enum: EVIDENCE_FILE_KINDS }).notNull().default("lab_report"),
    /** The sample a photo or image shows, when it shows one. */
    sampleLabel: text("sample_label"),
    uploadedBy: text("uploaded_by")
      .notNull()
      .references(() => users.id),
    uploadedAt: createdAt(),
    /**
     * A file attached in error is detached rather than deleted: `run_id` is cleared, so it leaves
     * the run's content and outcome, and these say where it was, when, by whom and why. The
     * stored bytes are kept.
     */
    detachedFromRunId: text("detached_from_run_id").references(() => testRuns.id),
    detachedAt: text("detached_at"),
    detachedBy: text("detached_by").references(() => users.id),
    detachReason: text("detach_reason"),
  },
  (t) => [
    index("evidence_files_run_idx").on(t.runId),
    index("evidence_files_sha_idx").on(t.sha256),
  ],
);
export type EvidenceFile = typeof evidenceFiles.$inferSelect;
