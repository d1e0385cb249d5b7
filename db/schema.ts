import { sql } from "drizzle-orm";
import {
  ROLES,
  STAGE_KINDS,
  STAGE_MODES,
  RECIPE_VERSION_STATUSES,
  PARAMETER_KINDS,
  DOCUMENT_TYPES,
  DOCUMENT_STATUSES,
  CHANGE_STATUSES,
  IMPACT_CLASSES,
  TEST_TYPES,
  RUN_STATUSES,
  OUTCOMES,
  SIGNATURE_MEANINGS,
  SIGNED_RECORD_TYPES,
  REVIEW_ROLES,
  REVIEW_DECISIONS,
  ROUTING_MODES,
  EVIDENCE_FILE_KINDS,
  BATH_RECORD_KINDS,
  MAINTENANCE_KINDS,
  CHANGE_KINDS,
  MATRIX_STATUSES,
  API_TOKEN_SCOPES,
} from "./enums";
import { index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";

export * from "./enums";

/** Times are ISO-8601 UTC strings (sortable, readable in the audit trail), except lucia's session expiry. */
const id = () => text("id").primaryKey().$defaultFn(() => crypto.randomUUID());
const createdAt = () => text("created_at").notNull().$defaultFn(() => new Date().toISOString());
const bool = (name: string) => integer(name, { mode: "boolean" });

// ── People and access ─────────────────────────────────────────────────────

export const users = sqliteTable("users", {
  id: id(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  jobTitle: text("job_title"),
  passwordHash: text("password_hash").notNull(),
  active: bool("active").notNull().default(true),
  failedAttempts: integer("failed_attempts").notNull().default(0),
  lockedUntil: text("locked_until"),
  mustChangePassword: bool("must_change_password").notNull().default(false),
  passwordChangedAt: text("password_changed_at"),
  createdAt: createdAt(),
});
export type User = typeof users.$inferSelect;


export const userRoles = sqliteTable(
  "user_roles",
  {
    userId: text("user_id").notNull().references(() => users.id),
    role: text("role", { enum: ROLES }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.role] })],
);
export type UserRole = typeof userRoles.$inferSelect;

export const sessions = sqliteTable(
  "sessions",
  {
    id: text("id").primaryKey(),
    userId: text("user_id").notNull().references(() => users.id),
    /** Unix seconds, as lucia's adapter writes it; moved forward on activity (idle timeout). */
    expiresAt: integer("expires_at").notNull(),
    /** Unix seconds; the absolute lifetime counts from here. */
    createdAt: integer("created_at").notNull(),
  },
  (t) => [index("sessions_user_idx").on(t.userId)],
);
export type Session = typeof sessions.$inferSelect;

// ── Plant ─────────────────────────────────────────────────────────────────

export const sites = sqliteTable("sites", {
  id: id(),
  name: text("name").notNull(),
  location: text("location"),
  createdAt: createdAt(),
});
export type Site = typeof sites.$inferSelect;

export const cleaningSystems = sqliteTable("cleaning_systems", {
  id: id(),
  siteId: text("site_id").notNull().references(() => sites.id),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  kind: text("kind", { enum: ["multi_tank_aqueous", "single_chamber_spray", "other"] }).notNull(),
  description: text("description"),
  active: bool("active").notNull().default(true),
  createdAt: createdAt(),
});
export type CleaningSystem = typeof cleaningSystems.$inferSelect;


/** A physical stage (tank or chamber step) of a cleaning system and what it can do. */
export const systemStages = sqliteTable(
  "system_stages",
  {
    id: id(),
    systemId: text("system_id").notNull().references(() => cleaningSystems.id),
    position: integer("position").notNull(),
    name: text("name").notNull(),
    kind: text("kind", { enum: STAGE_KINDS }).notNull(),
    /** JSON array of STAGE_MODES the stage supports. */
    capabilities: text("capabilities", { mode: "json" }).$type<string[]>().notNull(),
    tankVolumeL: real("tank_volume_l"),
  },
  (t) => [uniqueIndex("system_stages_position_uq").on(t.systemId, t.position)],
);
export type SystemStage = typeof systemStages.$inferSelect;

// ── Parts and specifications ──────────────────────────────────────────────

export const cleanlinessSpecs = sqliteTable("cleanliness_specs", {
  id: id(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  /** Per-size-class limits in CCC notation, e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00). */
  ccc: text("ccc").notNull(),
  maxMetallicUm: real("max_metallic_um"),
  maxNonMetallicUm: real("max_non_metallic_um"),
  maxFibreUm: real("max_fibre_um"),
  gravimetricLimitMg: real("gravimetric_limit_mg"),
  gravimetricBasis: text("gravimetric_basis", { enum: ["per_component", "per_1000_cm2"] }),
  minWettingTensionMNm: real("min_wetting_tension_mnm"),
  visualCriteria: text("visual_criteria"),
  drynessCriteria: text("dryness_criteria"),
  createdAt: createdAt(),
});
export type CleanlinessSpec = typeof cleanlinessSpecs.$inferSelect;

export const partFamilies = sqliteTable("part_families", {
  id: id(),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  material: text("material").notNull(),
  wettedAreaCm2: real("wetted_area_cm2").notNull(),
  wettedVolumeCm3: real("wetted_volume_cm3"),
  specId: text("spec_id").notNull().references(() => cleanlinessSpecs.id),
  description: text("description"),
  createdAt: createdAt(),
});
export type PartFamily = typeof partFamilies.$inferSelect;

// ── Recipes ───────────────────────────────────────────────────────────────

export const recipes = sqliteTable("recipes", {
  id: id(),
  systemId: text("system_id").notNull().references(() => cleaningSystems.id),
  code: text("code").notNull().unique(),
  name: text("name").notNull(),
  description: text("description"),
  createdAt: createdAt(),
});
export type Recipe = typeof recipes.$inferSelect;


export const recipeVersions = sqliteTable(
  "recipe_versions",
  {
    id: id(),
    recipeId: text("recipe_id").notNull().references(() => recipes.id),
    version: integer("version").notNull(),
    status: text("status", { enum: RECIPE_VERSION_STATUSES }).notNull().default("draft"),
    detergent: text("detergent"),
    notes: text("notes"),
    effectiveFrom: text("effective_from"),
    effectiveTo: text("effective_to"),
    createdBy: text("created_by").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("recipe_versions_uq").on(t.recipeId, t.version)],
);
export type RecipeVersion = typeof recipeVersions.$inferSelect;

export const recipeStages = sqliteTable(
  "recipe_stages",
  {
    id: id(),
    versionId: text("version_id").notNull().references(() => recipeVersions.id),
    position: integer("position").notNull(),
    name: text("name").notNull(),
    kind: text("kind", { enum: STAGE_KINDS }).notNull(),
    mode: text("mode", { enum: STAGE_MODES }),
  },
  (t) => [uniqueIndex("recipe_stages_position_uq").on(t.versionId, t.position)],
);
export type RecipeStage = typeof recipeStages.$inferSelect;


export const recipeParameters = sqliteTable(
  "recipe_parameters",
  {
    id: id(),
    versionId: text("version_id").notNull().references(() => recipeVersions.id),
    stageId: text("stage_id").notNull().references(() => recipeStages.id),
    /** Stable across versions (e.g. "wash.temperature") so a parameter can be traced. */
    key: text("key").notNull(),
    name: text("name").notNull(),
    kind: text("kind", { enum: PARAMETER_KINDS }).notNull(),
    setpoint: real("setpoint").notNull(),
    unit: text("unit").notNull(),
    /** The proven acceptable range. */
    validatedLow: real("validated_low"),
    validatedHigh: real("validated_high"),
    critical: bool("critical").notNull().default(false),
  },
  (t) => [uniqueIndex("recipe_parameters_key_uq").on(t.versionId, t.key), index("recipe_parameters_key_idx").on(t.key)],
);
export type RecipeParameter = typeof recipeParameters.$inferSelect;

// ── Documents ─────────────────────────────────────────────────────────────


export const documents = sqliteTable("documents", {
  id: id(),
  number: text("number").notNull().unique(),
  title: text("title").notNull(),
  type: text("type", { enum: DOCUMENT_TYPES }).notNull(),
  systemId: text("system_id").references(() => cleaningSystems.id),
  partFamilyId: text("part_family_id").references(() => partFamilies.id),
  recipeVersionId: text("recipe_version_id").references(() => recipeVersions.id),
  ownerId: text("owner_id").notNull().references(() => users.id),
  createdAt: createdAt(),
});
export type Document = typeof documents.$inferSelect;

export const documentVersions = sqliteTable(
  "document_versions",
  {
    id: id(),
    documentId: text("document_id").notNull().references(() => documents.id),
    version: integer("version").notNull(),
    status: text("status", { enum: DOCUMENT_STATUSES }).notNull().default("draft"),
    /** Tiptap JSON, validated and sanitised on the server. */
    content: text("content", { mode: "json" }).notNull(),
    /** SHA-256 of the canonical JSON, set when the version is frozen for review. */
    contentHash: text("content_hash"),
    /** Optimistic concurrency: every save must name the counter it read. */
    lockVersion: integer("lock_version").notNull().default(0),
    effectiveDate: text("effective_date"),
    /** Each submission opens a new review round; earlier rounds stay as history. */
    reviewRound: integer("review_round").notNull().default(0),
    routing: text("routing", { enum: ROUTING_MODES }),
    submittedAt: text("submitted_at"),
    approvedAt: text("approved_at"),
    /** Why this version exists, required once the document was ever approved (EU GMP Annex 11 §9). */
    changeReason: text("change_reason"),
    createdBy: text("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
    updatedAt: text("updated_at"),
  },
  (t) => [uniqueIndex("document_versions_uq").on(t.documentId, t.version)],
);
export type DocumentVersion = typeof documentVersions.$inferSelect;

// ── Change control ────────────────────────────────────────────────────────


export const changeRequests = sqliteTable(
  "change_requests",
  {
    id: id(),
    number: text("number").notNull().unique(),
    title: text("title").notNull(),
    recipeId: text("recipe_id").notNull().references(() => recipes.id),
    fromVersionId: text("from_version_id").references(() => recipeVersions.id),
    toVersionId: text("to_version_id").references(() => recipeVersions.id),
    status: text("status", { enum: CHANGE_STATUSES }).notNull().default("draft"),
    impact: text("impact", { enum: IMPACT_CLASSES }),
    /** The computed impact with its working, as shown to the approver. */
    impactDetails: text("impact_details", { mode: "json" }),
    narrativeDocumentId: text("narrative_document_id").references(() => documents.id),
    createdBy: text("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
    closedAt: text("closed_at"),
  },
  (t) => [index("change_requests_recipe_idx").on(t.recipeId), index("change_requests_status_idx").on(t.status)],
);
export type ChangeRequest = typeof changeRequests.$inferSelect;

// ── Evidence ──────────────────────────────────────────────────────────────


export const testRuns = sqliteTable(
  "test_runs",
  {
    id: id(),
    /** Shared by every revision of a run; (number, revision) is unique. */
    number: text("number").notNull(),
    partFamilyId: text("part_family_id").notNull().references(() => partFamilies.id),
    recipeVersionId: text("recipe_version_id").notNull().references(() => recipeVersions.id),
    changeRequestId: text("change_request_id").references(() => changeRequests.id),
    protocolDocumentId: text("protocol_document_id").references(() => documents.id),
    testType: text("test_type", { enum: TEST_TYPES }).notNull(),
    status: text("status", { enum: RUN_STATUSES }).notNull().default("open"),
    /** Computed from the stored results, never typed. */
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
    createdBy: text("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("test_runs_number_revision_uq").on(t.number, t.revision),
    index("test_runs_family_idx").on(t.partFamilyId),
    index("test_runs_recipe_version_idx").on(t.recipeVersionId),
    index("test_runs_change_idx").on(t.changeRequestId),
    // My queue reads the open and performed runs; the evidence table pages newest first.
    index("test_runs_status_idx").on(t.status),
    index("test_runs_performed_on_idx").on(t.performedOn, t.number, t.revision),
  ],
);
export type TestRun = typeof testRuns.$inferSelect;

/** Raw data of one sample of a run; `data` is validated per test type. */
export const testResults = sqliteTable(
  "test_results",
  {
    id: id(),
    runId: text("run_id").notNull().references(() => testRuns.id),
    sampleLabel: text("sample_label").notNull(),
    basketPosition: text("basket_position"),
    worstCase: bool("worst_case").notNull().default(false),
    data: text("data", { mode: "json" }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("test_results_run_idx").on(t.runId)],
);
export type TestResult = typeof testResults.$inferSelect;

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
    uploadedBy: text("uploaded_by").notNull().references(() => users.id),
    uploadedAt: createdAt(),
  },
  (t) => [index("evidence_files_run_idx").on(t.runId), index("evidence_files_sha_idx").on(t.sha256)],
);
export type EvidenceFile = typeof evidenceFiles.$inferSelect;

// ── Signatures and audit ──────────────────────────────────────────────────


export const signatures = sqliteTable(
  "signatures",
  {
    id: id(),
    recordType: text("record_type", { enum: SIGNED_RECORD_TYPES }).notNull(),
    recordId: text("record_id").notNull(),
    userId: text("user_id").notNull().references(() => users.id),
    /** The name as printed at the moment of signing (§11.50). */
    printedName: text("printed_name").notNull(),
    meaning: text("meaning", { enum: SIGNATURE_MEANINGS }).notNull(),
    signedAt: text("signed_at").notNull(),
    /** SHA-256 of exactly the record version signed (§11.70). */
    contentHash: text("content_hash").notNull(),
  },
  (t) => [
    index("signatures_record_idx").on(t.recordType, t.recordId),
    // A version returned to draft and resubmitted is new content: the same person may sign it again.
    uniqueIndex("signatures_once_per_content_uq").on(t.recordType, t.recordId, t.userId, t.meaning, t.contentHash),
  ],
);
export type Signature = typeof signatures.$inferSelect;

/** Append-only; triggers in the migrations refuse UPDATE and DELETE. */
export const auditEvents = sqliteTable(
  "audit_events",
  {
    seq: integer("seq").primaryKey({ autoIncrement: true }),
    at: text("at").notNull(),
    actorId: text("actor_id"),
    actorName: text("actor_name").notNull(),
    action: text("action").notNull(),
    recordType: text("record_type").notNull(),
    recordId: text("record_id").notNull(),
    /** Canonical JSON text, exactly as hashed. */
    oldValue: text("old_value"),
    newValue: text("new_value"),
    reason: text("reason"),
    prevHash: text("prev_hash").notNull(),
    hash: text("hash").notNull(),
  },
  (t) => [
    index("audit_record_idx").on(t.recordType, t.recordId),
    index("audit_actor_idx").on(t.actorId),
    index("audit_at_idx").on(t.at),
  ],
);
export type AuditEventRow = typeof auditEvents.$inferSelect;

// ── Outgoing e-mail ───────────────────────────────────────────────────────

export const emailOutbox = sqliteTable(
  "email_outbox",
  {
    id: id(),
    to: text("to").notNull(),
    subject: text("subject").notNull(),
    text: text("text").notNull(),
    html: text("html"),
    status: text("status", { enum: ["pending", "sent", "failed"] }).notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: text("next_attempt_at").notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`),
    lastError: text("last_error"),
    createdAt: createdAt(),
    sentAt: text("sent_at"),
  },
  (t) => [index("email_outbox_due_idx").on(t.status, t.nextAttemptAt)],
);
export type OutboxMessage = typeof emailOutbox.$inferSelect;

// ── Document review routing ───────────────────────────────────────────────

/**
 * One person's step in the routing of a document version: reviewers sign
 * "reviewed" or send back, the approver signs "approved" or rejects. Steps with
 * the same number run in parallel; a step becomes active (activatedAt) once
 * every earlier step has been decided.
 */
export const documentReviews = sqliteTable(
  "document_reviews",
  {
    id: id(),
    versionId: text("version_id").notNull().references(() => documentVersions.id),
    round: integer("round").notNull(),
    step: integer("step").notNull(),
    role: text("role", { enum: REVIEW_ROLES }).notNull(),
    assigneeId: text("assignee_id").notNull().references(() => users.id),
    activatedAt: text("activated_at"),
    dueAt: text("due_at"),
    decision: text("decision", { enum: REVIEW_DECISIONS }),
    comment: text("comment"),
    decidedAt: text("decided_at"),
    overdueNotifiedAt: text("overdue_notified_at"),
    createdAt: createdAt(),
  },
  (t) => [
    index("document_reviews_version_idx").on(t.versionId, t.round),
    index("document_reviews_assignee_idx").on(t.assigneeId, t.decision),
  ],
);
export type DocumentReview = typeof documentReviews.$inferSelect;

// ── Bath and filter log ───────────────────────────────────────────────────

/** One entry of a tank's log: a bath change, a filter change or a reading, with what was measured. */
export const bathRecords = sqliteTable(
  "bath_records",
  {
    id: id(),
    stageId: text("stage_id").notNull().references(() => systemStages.id),
    kind: text("kind", { enum: BATH_RECORD_KINDS }).notNull(),
    /** When the work or measurement was done (UTC). */
    performedAt: text("performed_at").notNull(),
    concentrationPct: real("concentration_pct"),
    conductivityUsPerCm: real("conductivity_us_per_cm"),
    temperatureC: real("temperature_c"),
    /** Particle counter results per mL at ≥ 4, ≥ 6 and ≥ 14 µm(c); the ISO 4406 code is computed. */
    countPerMl4: real("count_per_ml_4"),
    countPerMl6: real("count_per_ml_6"),
    countPerMl14: real("count_per_ml_14"),
    filterDescription: text("filter_description"),
    notes: text("notes"),
    recordedBy: text("recorded_by").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("bath_records_stage_idx").on(t.stageId, t.performedAt)],
);
export type BathRecord = typeof bathRecords.$inferSelect;

/** How often a tank's bath or filter must be changed (or its bath measured). */
export const maintenanceIntervals = sqliteTable(
  "maintenance_intervals",
  {
    id: id(),
    stageId: text("stage_id").notNull().references(() => systemStages.id),
    kind: text("kind", { enum: MAINTENANCE_KINDS }).notNull(),
    intervalDays: integer("interval_days").notNull(),
    /** Shown as due this many days before the date. */
    warnDays: integer("warn_days").notNull().default(2),
    createdBy: text("created_by").notNull().references(() => users.id),
    createdAt: createdAt(),
    updatedAt: text("updated_at"),
  },
  (t) => [uniqueIndex("maintenance_intervals_uq").on(t.stageId, t.kind)],
);
export type MaintenanceInterval = typeof maintenanceIntervals.$inferSelect;

/** One e-mail per interval, due date and level, so a reminder is never sent twice. */
export const maintenanceNotices = sqliteTable(
  "maintenance_notices",
  {
    id: id(),
    intervalId: text("interval_id").notNull().references(() => maintenanceIntervals.id),
    dueAt: text("due_at").notNull(),
    level: text("level", { enum: ["due", "overdue"] }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("maintenance_notices_uq").on(t.intervalId, t.dueAt, t.level)],
);
export type MaintenanceNotice = typeof maintenanceNotices.$inferSelect;

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
    matrixId: text("matrix_id").notNull().references(() => requalificationMatrices.id),
    subject: text("subject").notNull(),
    testType: text("test_type", { enum: TEST_TYPES }).notNull(),
    confidencePct: real("confidence_pct").notNull(),
    reliabilityPct: real("reliability_pct").notNull(),
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
    changeRequestId: text("change_request_id").notNull().references(() => changeRequests.id),
    testType: text("test_type", { enum: TEST_TYPES }).notNull(),
    samples: integer("samples").notNull(),
    confidencePct: real("confidence_pct").notNull(),
    reliabilityPct: real("reliability_pct").notNull(),
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
    requirementId: text("requirement_id").notNull().references(() => changeRequestTests.id),
    testRunId: text("test_run_id").notNull().references(() => testRuns.id),
    linkedBy: text("linked_by").notNull().references(() => users.id),
    linkedAt: createdAt(),
  },
  (t) => [uniqueIndex("change_request_evidence_uq").on(t.requirementId, t.testRunId)],
);
export type ChangeRequestEvidence = typeof changeRequestEvidence.$inferSelect;

/** Each validated recipe version × part family and how often it must be requalified. */
export const requalificationIntervals = sqliteTable(
  "requalification_intervals",
  {
    id: id(),
    recipeVersionId: text("recipe_version_id").notNull().references(() => recipeVersions.id),
    partFamilyId: text("part_family_id").notNull().references(() => partFamilies.id),
    intervalMonths: integer("interval_months").notNull().default(12),
    lastQualifiedAt: text("last_qualified_at").notNull(),
    /** The due date a reminder was last e-mailed for, so each is sent once. */
    notifiedForDue: text("notified_for_due"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("requalification_intervals_uq").on(t.recipeVersionId, t.partFamilyId)],
);
export type RequalificationInterval = typeof requalificationIntervals.$inferSelect;

// ── API access ────────────────────────────────────────────────────────────

/**
 * A personal API token. Only its SHA-256 is stored; the token itself is shown once
 * at creation, and afterwards only its prefix identifies it. A token acts with its
 * owner's roles, never more, and a read token never writes.
 */
export const apiTokens = sqliteTable(
  "api_tokens",
  {
    id: id(),
    userId: text("user_id").notNull().references(() => users.id),
    name: text("name").notNull(),
    /** The first characters of the token, enough to recognise it in a list. */
    prefix: text("prefix").notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    scope: text("scope", { enum: API_TOKEN_SCOPES }).notNull(),
    createdAt: createdAt(),
    lastUsedAt: text("last_used_at"),
    revokedAt: text("revoked_at"),
  },
  (t) => [index("api_tokens_user_idx").on(t.userId)],
);
export type ApiToken = typeof apiTokens.$inferSelect;
