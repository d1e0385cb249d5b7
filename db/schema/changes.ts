import { sql } from "drizzle-orm";
import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import {
  CHANGE_STATUSES,
  IMPACT_CLASSES,
  TEST_TYPES,
  CHANGE_KINDS,
  MATRIX_STATUSES,
} from "../enums";
import { createdAt, id } from "./columns";
import { documents } from "./documents";
import { testRuns } from "./evidence";
import { partFamilies } from "./parts";
import { users } from "./people";
import { recipeVersions, recipes } from "./recipes";

// ── Change control ────────────────────────────────────────────────────────

export const changeRequests = sqliteTable(
  "change_requests",
  {
    id: id(),
    number: text("number").notNull().unique(),
    title: text("title").notNull(),
    recipeId: text("recipe_id")
      .notNull()
      .references(() => recipes.id),
    fromVersionId: text("from_version_id").references(() => recipeVersions.id),
    toVersionId: text("to_version_id").references(() => recipeVersions.id),
    status: text("status", { enum: CHANGE_STATUSES }).notNull().default("draft"),
    impact: text("impact", { enum: IMPACT_CLASSES }),
    /** The computed impact with its working, as shown to the approver. */
    impactDetails: text("impact_details", { mode: "json" }),
    narrativeDocumentId: text("narrative_document_id").references(() => documents.id),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    closedAt: text("closed_at"),
  },
  (t) => [
    index("change_requests_recipe_idx").on(t.recipeId),
    index("change_requests_status_idx").on(t.status),
    // The change list, newest first, stops after one page.
    index("change_requests_created_idx").on(t.createdAt, t.number),
  ],
);
export type ChangeRequest = typeof changeRequests.$inferSelect;

// ── Change control: requalification ───────────────────────────────────────

/** Admin-maintained, versioned: editing makes a new version; a change request keeps the version it was assessed with. */
export const requalificationMatrices = sqliteTable("requalification_matrices", {
  id: id(),
  version: integer("version").notNull().unique(),
  status: text("status", { enum: MATRIX_STATUSES }).notNull(),
  note: text("note"),
  createdBy: text("created_by").references(() => users.id),
  createdAt: createdAt(),
});
export type RequalificationMatrix = typeof requalificationMatrices.$inferSelect;

/** One subject (parameter kind, stage kind, detergent, part family) → one test at a confidence and reliability. */
export const requalificationMatrixRows = sqliteTable(
  "requalification_matrix_rows",
  {
    id: id(),
    matrixId: text("matrix_id")
      .notNull()
      .references(() => requalificationMatrices.id),
    subject: text("subject").notNull(),
    testType: text("test_type", { enum: TEST_TYPES }).notNull(),
    confidencePct: real("confidence_pct").notNull(),
    reliabilityPct: real("reliability_pct").notNull(),
    /** Parts from one basket are not independent: the samples must come from at least this many wash cycles. */
    minCycles: integer("min_cycles").notNull().default(3),
  },
  (t) => [uniqueIndex("requalification_matrix_rows_uq").on(t.matrixId, t.subject, t.testType)],
);
export type RequalificationMatrixRow = typeof requalificationMatrixRows.$inferSelect;

/** The change-request facts that came with change control proper. */
export const changeRequestAssessments = sqliteTable("change_request_assessments", {
  changeRequestId: text("change_request_id")
    .primaryKey()
    .references(() => changeRequests.id),
  kind: text("kind", { enum: CHANGE_KINDS }).notNull(),
  /** The part family a "new part family" change adds to the recipe. */
  partFamilyId: text("part_family_id").references(() => partFamilies.id),
  computedImpact: text("computed_impact", { enum: IMPACT_CLASSES }),
  /** The class the engineer raised it to, with the reason (never lowered below the computed one). */
  raisedTo: text("raised_to", { enum: IMPACT_CLASSES }),
  raiseReason: text("raise_reason"),
  /** Counts reopenings: signatures bind to "<change id>#<revision>", so those on an earlier revision stay with it. */
  revision: integer("revision").notNull().default(1),
  /** Counts proposal saves: a save made from an older reading is refused, never applied over a newer one. */
  lockVersion: integer("lock_version").notNull().default(0),
  matrixId: text("matrix_id").references(() => requalificationMatrices.id),
  /** SHA-256 of the assessed content, frozen at submission; signatures bind to it. */
  contentHash: text("content_hash"),
  updatedAt: text("updated_at"),
});
export type ChangeRequestAssessment = typeof changeRequestAssessments.$inferSelect;

/** The tests a change request calls for, with the sample size the matrix gave. */
export const changeRequestTests = sqliteTable(
  "change_request_tests",
  {
    id: id(),
    changeRequestId: text("change_request_id")
      .notNull()
      .references(() => changeRequests.id),
    testType: text("test_type", { enum: TEST_TYPES }).notNull(),
    samples: integer("samples").notNull(),
    confidencePct: real("confidence_pct").notNull(),
    reliabilityPct: real("reliability_pct").notNull(),
    /** Distinct wash cycles the samples must come from; null on requirements set before cycles were counted. */
    minCycles: integer("min_cycles"),
    because: text("because", { mode: "json" }).$type<string[]>().notNull(),
  },
  (t) => [uniqueIndex("change_request_tests_uq").on(t.changeRequestId, t.testType)],
);
export type ChangeRequestTest = typeof changeRequestTests.$inferSelect;

/** A test run offered as the evidence for one required test. */
export const changeRequestEvidence = sqliteTable(
  "change_request_evidence",
  {
    id: id(),
    requirementId: text("requirement_id")
      .notNull()
      .references(() => changeRequestTests.id),
    testRunId: text("test_run_id")
      .notNull()
      .references(() => testRuns.id),
    linkedBy: text("linked_by")
      .notNull()
      .references(() => users.id),
    linkedAt: createdAt(),
  },
  (t) => [uniqueIndex("change_request_evidence_uq").on(t.requirementId, t.testRunId)],
);
export type ChangeRequestEvidence = typeof changeRequestEvidence.$inferSelect;

/**
 * The qualified combinations: each recipe version validated for a part family, and how often it
 * must be requalified. A run is opened only on one of these (or on the change or the validation
 * protocol that qualifies one); closing a change carries them to the new version.
 */
// Day of the month kept, or the target month's last day when it is shorter; time of day kept.
const requalificationDueSql = sql.raw(
  `date(last_qualified_at, 'start of month', '+' || interval_months || ' months', ` +
    `'+' || (min(cast(strftime('%d', last_qualified_at) as integer), ` +
    `cast(strftime('%d', date(last_qualified_at, 'start of month', '+' || (interval_months + 1) || ' months', '-1 day')) as integer)) - 1) || ' days')` +
    ` || 'T' || strftime('%H:%M:%f', last_qualified_at) || 'Z'`,
);

export const requalificationIntervals = sqliteTable(
  "requalification_intervals",
  {
    id: id(),
    recipeVersionId: text("recipe_version_id")
      .notNull()
      .references(() => recipeVersions.id),
    partFamilyId: text("part_family_id")
      .notNull()
      .references(() => partFamilies.id),
    intervalMonths: integer("interval_months").notNull().default(12),
    lastQualifiedAt: text("last_qualified_at").notNull(),
    /** What proves the qualification (validation report, change request, run numbers), in words; null when carried over by a change. */
    basis: text("basis"),
    qualifiedBy: text("qualified_by").references(() => users.id),
    /** The due date a reminder was last e-mailed for, so each is sent once. */
    notifiedForDue: text("notified_for_due"),
    createdAt: createdAt(),
    /**
     * When the next requalification falls due: the same day `interval_months` calendar months on,
     * clamped to the month's last day, at the same time (lib/changes/periodic.ts computes the same).
     * SQLite derives it from the row, so it cannot drift, and My queue pages on its index.
     */
    dueAt: text("due_at").generatedAlwaysAs(requalificationDueSql, { mode: "virtual" }),
  },
  (t) => [
    uniqueIndex("requalification_intervals_uq").on(t.recipeVersionId, t.partFamilyId),
    index("requalification_intervals_due_idx").on(t.dueAt),
  ],
);
export type RequalificationInterval = typeof requalificationIntervals.$inferSelect;
