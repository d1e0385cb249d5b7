import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { STAGE_KINDS, STAGE_MODES, RECIPE_VERSION_STATUSES, PARAMETER_KINDS } from "../enums";
import { bool, createdAt, id } from "./columns";
import { users } from "./people";
import { cleaningSystems } from "./plant";

// ── Recipes ───────────────────────────────────────────────────────────────

export const recipes = sqliteTable(
  "recipes",
  {
    id: id(),
    systemId: text("system_id")
      .notNull()
      .references(() => cleaningSystems.id),
    code: text("code").notNull().unique(),
    name: text("name").notNull(),
    description: text("description"),
    createdAt: createdAt(),
  },
  // The plant overview reads a washer's recipe versions for each of its part families.
  (t) => [index("recipes_system_idx").on(t.systemId)],
);
export type Recipe = typeof recipes.$inferSelect;

export const recipeVersions = sqliteTable(
  "recipe_versions",
  {
    id: id(),
    recipeId: text("recipe_id")
      .notNull()
      .references(() => recipes.id),
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
    versionId: text("version_id")
      .notNull()
      .references(() => recipeVersions.id),
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
    versionId: text("version_id")
      .notNull()
      .references(() => recipeVersions.id),
    stageId: text("stage_id")
      .notNull()
      .references(() => recipeStages.id),
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
  (t) => [
    uniqueIndex("recipe_parameters_key_uq").on(t.versionId, t.key),
    index("recipe_parameters_key_idx").on(t.key),
  ],
);
export type RecipeParameter = typeof recipeParameters.$inferSelect;
