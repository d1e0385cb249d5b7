import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
// Relative: drizzle-kit reads this file without the app's path aliases.
import { DEVIATION_STATUSES, RISK_LEVELS } from "../../lib/deviations/rules";
import { createdAt, id } from "./columns";
import { partFamilies } from "./parts";
import { users } from "./people";
import { recipes } from "./recipes";

// ── Temporary deviations ──────────────────────────────────────────────────

/** A planned, time-limited permission to run a recipe outside a parameter's validated range. */
export const deviations = sqliteTable(
  "deviations",
  {
    id: id(),
    /** DV-YYYY-NNN. */
    number: text("number").notNull().unique(),
    recipeId: text("recipe_id")
      .notNull()
      .references(() => recipes.id),
    title: text("title").notNull(),
    justification: text("justification").notNull(),
    riskLevel: text("risk_level", { enum: RISK_LEVELS }).notNull(),
    risk: text("risk").notNull(),
    /** Last calendar day it may be used (YYYY-MM-DD); null when only the lot count limits it. */
    endsOn: text("ends_on"),
    maxLots: integer("max_lots"),
    reminderDays: integer("reminder_days").notNull().default(3),
    /** Stored status; "active" is approved and not yet past a limit, computed on read. */
    status: text("status", { enum: DEVIATION_STATUSES }).notNull().default("draft"),
    approvedAt: text("approved_at"),
    endedAt: text("ended_at"),
    /** The end date a reminder was last sent for, so each is sent once. */
    remindedForEnd: text("reminded_for_end"),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index("deviations_recipe_idx").on(t.recipeId),
    index("deviations_status_idx").on(t.status),
  ],
);
export type Deviation = typeof deviations.$inferSelect;

export const deviationPartFamilies = sqliteTable(
  "deviation_part_families",
  {
    deviationId: text("deviation_id")
      .notNull()
      .references(() => deviations.id),
    partFamilyId: text("part_family_id")
      .notNull()
      .references(() => partFamilies.id),
  },
  (t) => [uniqueIndex("deviation_part_families_uq").on(t.deviationId, t.partFamilyId)],
);

/** A parameter (by its stable key) with the validated range it departs from and its temporary range. */
export const deviationParameters = sqliteTable(
  "deviation_parameters",
  {
    id: id(),
    deviationId: text("deviation_id")
      .notNull()
      .references(() => deviations.id),
    key: text("key").notNull(),
    name: text("name").notNull(),
    unit: text("unit").notNull(),
    validatedLow: real("validated_low"),
    validatedHigh: real("validated_high"),
    temporaryLow: real("temporary_low"),
    temporaryHigh: real("temporary_high"),
  },
  (t) => [
    uniqueIndex("deviation_parameters_uq").on(t.deviationId, t.key),
    index("deviation_parameters_key_idx").on(t.key),
  ],
);
export type DeviationParameter = typeof deviationParameters.$inferSelect;

/** One lot processed under a deviation: what counts toward its lot limit. */
export const deviationLots = sqliteTable(
  "deviation_lots",
  {
    id: id(),
    deviationId: text("deviation_id")
      .notNull()
      .references(() => deviations.id),
    lot: text("lot").notNull(),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => users.id),
    recordedAt: createdAt(),
  },
  (t) => [uniqueIndex("deviation_lots_uq").on(t.deviationId, t.lot)],
);
