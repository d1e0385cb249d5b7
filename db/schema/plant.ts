import { integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { STAGE_KINDS } from "../enums";
import { bool, createdAt, id } from "./columns";

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


/**
 * One stage of a cleaning system: a step of its sequence and the modes it can run — a tank of a
 * multi-tank washer, or a step of a single-chamber machine fed from its own tank (spray wash,
 * hot-air drying). The tank is the vessel that holds the stage's bath (`tankVolumeL`, none for a
 * dryer); the bath and filter log is kept per tank under its stage's id.
 */
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
