import { integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { STAGE_KINDS } from "../enums";
import { bool, createdAt, id } from "./columns";

// ── Plant ─────────────────────────────────────────────────────────────────

/**
 * The installation's own name, set once by the first administrator. One row only: the
 * fixed id makes a second set-up a primary-key clash rather than a second company.
 */
export const companySettings = sqliteTable("company_settings", {
  id: text("id")
    .primaryKey()
    .$defaultFn(() => "company"),
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
  siteId: text("site_id")
    .notNull()
    .references(() => sites.id),
  code: text("code").notNull().unique(),
  /** The plant's own asset register number for the washer (unique when given). */
  assetNumber: text("asset_number").unique(),
  name: text("name").notNull(),
  kind: text("kind", { enum: ["multi_tank_aqueous", "single_chamber_spray", "other"] }).notNull(),
  description: text("description"),
  active: bool("active").notNull().default(true),
  retiredAt: text("retired_at"),
  retireReason: text("retire_reason"),
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
    systemId: text("system_id")
      .notNull()
      .references(() => cleaningSystems.id),
    position: integer("position").notNull(),
    name: text("name").notNull(),
    kind: text("kind", { enum: STAGE_KINDS }).notNull(),
    /** JSON array of STAGE_MODES the stage supports. */
    capabilities: text("capabilities", { mode: "json" }).$type<string[]>().notNull(),
    tankVolumeL: real("tank_volume_l"),
    /** Bath filtration: the nominal rating of the finest filter on the stage's circuit. */
    filterRatingUm: real("filter_rating_um"),
    ultrasonicPowerW: real("ultrasonic_power_w"),
    ultrasonicFrequencyKHz: real("ultrasonic_frequency_khz"),
    /** The highest pressure the spray or injection pumps deliver. */
    sprayPressureBar: real("spray_pressure_bar"),
    injectionPressureBar: real("injection_pressure_bar"),
    /** The nozzle set fitted (its drawing or part number): a new set changes how parts are hit. */
    nozzleSet: text("nozzle_set"),
  },
  (t) => [uniqueIndex("system_stages_position_uq").on(t.systemId, t.position)],
);
export type SystemStage = typeof systemStages.$inferSelect;
