import { real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { BATH_CHEMISTRY_KEYS } from "../enums";
import { createdAt, id } from "./columns";
import { users } from "./people";
import { systemStages } from "./plant";
import { recipeVersions } from "./recipes";

// ── Bath chemistry: detergent register and per-tank measurement plan ──────

/** A detergent with the titration factor its supplier states (% concentration per mL of titrant). */
export const detergents = sqliteTable("detergents", {
  id: id(),
  name: text("name").notNull().unique(),
  supplier: text("supplier"),
  /** What the sample is titrated with, e.g. "0.1 mol/L HCl, 10 mL sample, phenolphthalein". */
  titrationMethod: text("titration_method"),
  factorPctPerMl: real("factor_pct_per_ml").notNull(),
  createdBy: text("created_by")
    .notNull()
    .references(() => users.id),
  createdAt: createdAt(),
  updatedAt: text("updated_at"),
});
export type Detergent = typeof detergents.$inferSelect;

/**
 * One controlled bath value of a tank: target, action and reject limits, citing the recipe
 * version in force they were taken from. Either side of a band may be open.
 */
export const bathLimits = sqliteTable(
  "bath_limits",
  {
    id: id(),
    stageId: text("stage_id")
      .notNull()
      .references(() => systemStages.id),
    variable: text("variable", { enum: BATH_CHEMISTRY_KEYS }).notNull(),
    recipeVersionId: text("recipe_version_id")
      .notNull()
      .references(() => recipeVersions.id),
    detergentId: text("detergent_id").references(() => detergents.id),
    target: real("target"),
    actionLow: real("action_low"),
    actionHigh: real("action_high"),
    rejectLow: real("reject_low"),
    rejectHigh: real("reject_high"),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
    updatedAt: text("updated_at"),
  },
  (t) => [uniqueIndex("bath_limits_uq").on(t.stageId, t.variable)],
);
export type BathLimit = typeof bathLimits.$inferSelect;
