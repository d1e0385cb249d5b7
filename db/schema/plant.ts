import { integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { STAGE_KINDS } from "../enums";
import { bool, createdAt, id } from "./columns";

// ── Plant ─────────────────────────────────────────────────────────────────

/**
 * The installation's own name, set once by the first administrator. One row only: the
 * fixed id makes a second set-up a primary-key clash rather than a second company.
 */
export const companySettings = sqliteTable("company_settings", {
  id: text("id").primaryKey().$defaultFn(() => "company"),
  companyName: text("company_name").notNull(),
  createdAt: createdAt(),
  updatedAt: text("updated_at"),
});
export type CompanySettings = typeof companySettings.$inferSelect;

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
