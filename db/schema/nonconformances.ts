import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import {
  NC_ACTION_KINDS,
  NC_ACTION_STATUSES,
  NC_CAUSE_METHODS,
  NC_DISPOSITIONS,
  NC_EFFECTIVENESS_RESULTS,
  NC_HOLD_STATES,
  NC_ITEM_KINDS,
  NC_MANUAL_KINDS,
  NC_SEVERITIES,
  NC_SOURCE_KINDS,
  NC_STATUSES,
} from "../enums";
import { changeRequests } from "./changes";
import { createdAt, id } from "./columns";
import { evidenceFiles, testRuns } from "./evidence";
import { partFamilies } from "./parts";
import { users } from "./people";
import { recipes } from "./recipes";

// ── Nonconformances ───────────────────────────────────────────────────────

/** A failed result or a reported problem, worked from containment to a signed closure. */
export const nonconformances = sqliteTable(
  "nonconformances",
  {
    id: id(),
    /** NC-YYYY-NNN; (year, sequence) has no gaps within a year. */
    number: text("number").notNull().unique(),
    year: integer("year").notNull(),
    sequence: integer("sequence").notNull(),
    title: text("title").notNull(),
    description: text("description").notNull(),
    severity: text("severity", { enum: NC_SEVERITIES }).notNull(),
    sourceKind: text("source_kind", { enum: NC_SOURCE_KINDS }).notNull(),
    /** The failed record (run, reading, cycle …); null for a report by hand. */
    sourceId: text("source_id"),
    sourceLabel: text("source_label").notNull(),
    /** What a person reported by hand: customer complaint, field return or audit finding. */
    manualKind: text("manual_kind", { enum: NC_MANUAL_KINDS }),
    detectedOn: text("detected_on").notNull(),
    recipeId: text("recipe_id").references(() => recipes.id),
    partFamilyId: text("part_family_id").references(() => partFamilies.id),
    status: text("status", { enum: NC_STATUSES }).notNull().default("open"),
    ownerId: text("owner_id").references(() => users.id),
    dueOn: text("due_on"),
    causeMethod: text("cause_method", { enum: NC_CAUSE_METHODS }),
    /** Tiptap JSON, validated and cleaned as document content is. */
    rootCause: text("root_cause", { mode: "json" }),
    effectivenessCriterion: text("effectiveness_criterion"),
    effectivenessDueOn: text("effectiveness_due_on"),
    effectivenessResult: text("effectiveness_result", { enum: NC_EFFECTIVENESS_RESULTS }),
    effectivenessNote: text("effectiveness_note"),
    /** The evidence the result rests on: a verified run or an uploaded file (one of the two). */
    effectivenessRunId: text("effectiveness_run_id").references(() => testRuns.id),
    effectivenessFileId: text("effectiveness_file_id").references(() => evidenceFiles.id),
    effectivenessCheckedBy: text("effectiveness_checked_by").references(() => users.id),
    effectivenessCheckedAt: text("effectiveness_checked_at"),
    cancelReason: text("cancel_reason"),
    openedBy: text("opened_by").references(() => users.id),
    createdAt: createdAt(),
    closedAt: text("closed_at"),
  },
  (t) => [
    uniqueIndex("nonconformances_year_sequence_uq").on(t.year, t.sequence),
    index("nonconformances_status_idx").on(t.status),
    index("nonconformances_recipe_idx").on(t.recipeId),
    index("nonconformances_family_idx").on(t.partFamilyId),
    index("nonconformances_source_idx").on(t.sourceKind, t.sourceId),
    index("nonconformances_owner_idx").on(t.ownerId),
  ],
);
export type Nonconformance = typeof nonconformances.$inferSelect;

/** One processed item in containment: held or released, then disposed of. */
export const nonconformanceItems = sqliteTable(
  "nonconformance_items",
  {
    id: id(),
    nonconformanceId: text("nonconformance_id")
      .notNull()
      .references(() => nonconformances.id),
    itemKind: text("item_kind", { enum: NC_ITEM_KINDS }).notNull(),
    itemId: text("item_id").notNull(),
    label: text("label").notNull(),
    lots: text("lots", { mode: "json" }).$type<string[]>().notNull(),
    processedAt: text("processed_at").notNull(),
    hold: text("hold", { enum: NC_HOLD_STATES }).notNull().default("pending"),
    holdBy: text("hold_by").references(() => users.id),
    holdAt: text("hold_at"),
    disposition: text("disposition", { enum: NC_DISPOSITIONS }),
    /** Re-clean: the recipe the items are washed again under before retest. */
    recleanRecipeId: text("reclean_recipe_id").references(() => recipes.id),
    /** Use as is: the customer's concession reference and letter. */
    concessionReference: text("concession_reference"),
    concessionFileId: text("concession_file_id").references(() => evidenceFiles.id),
    dispositionNote: text("disposition_note"),
    dispositionBy: text("disposition_by").references(() => users.id),
    dispositionAt: text("disposition_at"),
  },
  (t) => [uniqueIndex("nonconformance_items_uq").on(t.nonconformanceId, t.itemKind, t.itemId)],
);
export type NonconformanceItem = typeof nonconformanceItems.$inferSelect;

/** A corrective or preventive action; a corrective one may open a change request. */
export const nonconformanceActions = sqliteTable(
  "nonconformance_actions",
  {
    id: id(),
    nonconformanceId: text("nonconformance_id")
      .notNull()
      .references(() => nonconformances.id),
    kind: text("kind", { enum: NC_ACTION_KINDS }).notNull(),
    description: text("description").notNull(),
    ownerId: text("owner_id")
      .notNull()
      .references(() => users.id),
    dueOn: text("due_on").notNull(),
    status: text("status", { enum: NC_ACTION_STATUSES }).notNull().default("open"),
    /** Where the work is shown done: a run number, a document, a URL. */
    evidenceLink: text("evidence_link"),
    changeRequestId: text("change_request_id").references(() => changeRequests.id),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    doneAt: text("done_at"),
  },
  (t) => [
    index("nonconformance_actions_nc_idx").on(t.nonconformanceId),
    index("nonconformance_actions_owner_idx").on(t.ownerId, t.status),
    index("nonconformance_actions_change_idx").on(t.changeRequestId),
  ],
);
export type NonconformanceAction = typeof nonconformanceActions.$inferSelect;

/** Files uploaded to a nonconformance (concession letters, effectiveness evidence). */
export const nonconformanceFiles = sqliteTable(
  "nonconformance_files",
  {
    id: id(),
    nonconformanceId: text("nonconformance_id")
      .notNull()
      .references(() => nonconformances.id),
    fileId: text("file_id")
      .notNull()
      .references(() => evidenceFiles.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("nonconformance_files_uq").on(t.nonconformanceId, t.fileId)],
);
export type NonconformanceFile = typeof nonconformanceFiles.$inferSelect;

/** One e-mail per action (or NC), due date and level, so a reminder is never sent twice. */
export const nonconformanceNotices = sqliteTable(
  "nonconformance_notices",
  {
    id: id(),
    /** `action:<id>` or `nc:<id>`. */
    subject: text("subject").notNull(),
    dueOn: text("due_on").notNull(),
    level: text("level", { enum: ["due", "overdue"] }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("nonconformance_notices_uq").on(t.subject, t.dueOn, t.level)],
);
