import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
// Relative: drizzle-kit reads this file without the app's path aliases.
import {
  CHARACTERISTICS,
  CONTROL_PLAN_STATUSES,
  FREQUENCIES,
} from "../../lib/control-plans/characteristics";
import { createdAt, id } from "./columns";
import { partFamilies } from "./parts";
import { users } from "./people";
import { sites, systemStages } from "./plant";
import { recipeVersions } from "./recipes";

// ── Control plans: the routine tests of a qualified combination ──────────

/** One plan per qualified combination (recipe version × part family); its content lives in versions. */
export const controlPlans = sqliteTable(
  "control_plans",
  {
    id: id(),
    recipeVersionId: text("recipe_version_id")
      .notNull()
      .references(() => recipeVersions.id),
    partFamilyId: text("part_family_id")
      .notNull()
      .references(() => partFamilies.id),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("control_plans_combination_uq").on(t.recipeVersionId, t.partFamilyId),
    index("control_plans_family_idx").on(t.partFamilyId),
  ],
);
export type ControlPlan = typeof controlPlans.$inferSelect;

/** draft → in review → reviewed → effective; a newer effective version supersedes it. */
export const controlPlanVersions = sqliteTable(
  "control_plan_versions",
  {
    id: id(),
    planId: text("plan_id")
      .notNull()
      .references(() => controlPlans.id),
    version: integer("version").notNull(),
    status: text("status", { enum: CONTROL_PLAN_STATUSES }).notNull().default("draft"),
    /** Why this version was written (the first: "first issue"). */
    note: text("note").notNull(),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    effectiveAt: text("effective_at"),
    supersededAt: text("superseded_at"),
  },
  (t) => [
    uniqueIndex("control_plan_versions_uq").on(t.planId, t.version),
    index("control_plan_versions_status_idx").on(t.status),
  ],
);
export type ControlPlanVersion = typeof controlPlanVersions.$inferSelect;

/** What is tested, how, how many, how often, and what to do when it is out. */
export const controlPlanLines = sqliteTable(
  "control_plan_lines",
  {
    id: id(),
    versionId: text("version_id")
      .notNull()
      .references(() => controlPlanVersions.id),
    position: integer("position").notNull(),
    characteristic: text("characteristic", { enum: CHARACTERISTICS }).notNull(),
    method: text("method").notNull(),
    /** The tank a bath characteristic is read on; null for tests on parts. */
    stageId: text("stage_id").references(() => systemStages.id),
    sampleSize: integer("sample_size").notNull(),
    /** Independent cycles the samples come from; null where it does not apply (bath readings). */
    minCycles: integer("min_cycles"),
    frequency: text("frequency", { enum: FREQUENCIES }).notNull(),
    everyN: integer("every_n"),
    reactionPlan: text("reaction_plan").notNull(),
  },
  (t) => [uniqueIndex("control_plan_lines_position_uq").on(t.versionId, t.position)],
);
export type ControlPlanLine = typeof controlPlanLines.$inferSelect;

/** One overdue e-mail per line and due date. */
export const controlPlanOverdueNotices = sqliteTable(
  "control_plan_overdue_notices",
  {
    lineId: text("line_id")
      .notNull()
      .references(() => controlPlanLines.id),
    dueAt: text("due_at").notNull(),
    sentAt: createdAt(),
  },
  (t) => [uniqueIndex("control_plan_overdue_notices_uq").on(t.lineId, t.dueAt)],
);

/** A site's shift start times and time zone; absent until an administrator saves them (defaults apply). */
export const siteClocks = sqliteTable("site_clocks", {
  siteId: text("site_id")
    .primaryKey()
    .references(() => sites.id),
  /** IANA zone name, e.g. "Europe/Berlin". */
  timeZone: text("time_zone").notNull(),
  /** Local shift start times "HH:MM", sorted. */
  shiftStarts: text("shift_starts", { mode: "json" }).$type<string[]>().notNull(),
  updatedBy: text("updated_by").references(() => users.id),
  updatedAt: text("updated_at"),
});
export type SiteClockRow = typeof siteClocks.$inferSelect;
