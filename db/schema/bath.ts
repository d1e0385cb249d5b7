import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { BATH_RECORD_KINDS, MAINTENANCE_KINDS } from "../enums";
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
    filterDescription: text("filter_description"),
    notes: text("notes"),
    recordedBy: text("recorded_by")
      .notNull()
      .references(() => users.id),
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
