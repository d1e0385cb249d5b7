import { sql } from "drizzle-orm";
import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { BATH_LIMIT_STATES, BATH_RECORD_KINDS, CHECK_RESULTS, MAINTENANCE_KINDS } from "../enums";
import { detergents } from "./bath-plan";
import { evidenceFiles } from "./evidence";
import { createdAt, id } from "./columns";
import { users } from "./people";
import { systemStages } from "./plant";

// ── Bath and filter log ───────────────────────────────────────────────────

/** One entry of a tank's log: a bath change, a filter change or a reading, with what was measured. */
export const bathRecords = sqliteTable(
  "bath_records",
  {
    id: id(),
    stageId: text("stage_id")
      .notNull()
      .references(() => systemStages.id),
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
    ph: real("ph"),
    oilContentGPerL: real("oil_content_g_per_l"),
    /** A titrated concentration keeps its inputs, so the % can be recomputed from what was read. */
    titrantVolumeMl: real("titrant_volume_ml"),
    detergentId: text("detergent_id").references(() => detergents.id),
    titrationFactor: real("titration_factor"),
    /** A detergent top-up: how much of which lot. */
    additionQuantity: real("addition_quantity"),
    additionUnit: text("addition_unit"),
    additionLot: text("addition_lot"),
    filterDescription: text("filter_description"),
    filterRatingUm: real("filter_rating_um"),
    differentialPressureBar: real("differential_pressure_bar"),
    /** Nozzle checks and ultrasonic foil tests: the result and the photo that shows it. */
    checkResult: text("check_result", { enum: CHECK_RESULTS }),
    photoFileId: text("photo_file_id").references(() => evidenceFiles.id),
    /** The reading graded against the tank's measurement plan when it was recorded. */
    limitState: text("limit_state", { enum: BATH_LIMIT_STATES }),
    limitFindings: text("limit_findings"),
    notes: text("notes"),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index("bath_records_stage_idx").on(t.stageId, t.performedAt),
    // My queue asks for the readings beyond a limit: few among years of log. Partial, so the
    // queue reads those few instead of the whole log (the query names the same two states).
    index("bath_records_beyond_limit_idx")
      .on(t.stageId, t.performedAt)
      .where(sql`${t.limitState} in ('action', 'reject')`),
  ],
);
export type BathRecord = typeof bathRecords.$inferSelect;

/** How often a tank's bath or filter must be changed (or its bath measured). */
export const maintenanceIntervals = sqliteTable(
  "maintenance_intervals",
  {
    id: id(),
    stageId: text("stage_id")
      .notNull()
      .references(() => systemStages.id),
    kind: text("kind", { enum: MAINTENANCE_KINDS }).notNull(),
    intervalDays: integer("interval_days").notNull(),
    /** Shown as due this many days before the date. */
    warnDays: integer("warn_days").notNull().default(2),
    createdBy: text("created_by")
      .notNull()
      .references(() => users.id),
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
    intervalId: text("interval_id")
      .notNull()
      .references(() => maintenanceIntervals.id),
    dueAt: text("due_at").notNull(),
    level: text("level", { enum: ["due", "overdue"] }).notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("maintenance_notices_uq").on(t.intervalId, t.dueAt, t.level)],
);
export type MaintenanceNotice = typeof maintenanceNotices.$inferSelect;
