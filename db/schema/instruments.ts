import {
  index,
  integer,
  primaryKey,
  sqliteTable,
  text,
  uniqueIndex,
} from "drizzle-orm/sqlite-core";
// Relative: drizzle-kit reads this file without the app's path aliases.
import {
  CALIBRATION_PERFORMERS,
  CALIBRATION_RESULTS,
  INSTRUMENT_KINDS,
  INSTRUMENT_STATUSES,
} from "../../lib/instruments/kinds";
import { createdAt, id } from "./columns";
import { evidenceFiles, testRuns } from "./evidence";
import { users } from "./people";

// ── Instruments and calibration ───────────────────────────────────────────

/** The lab's measuring equipment: each entry is calibrated on an interval, a test-ink set expires. */
export const instruments = sqliteTable(
  "instruments",
  {
    id: id(),
    assetNumber: text("asset_number").notNull().unique(),
    kind: text("kind", { enum: INSTRUMENT_KINDS }).notNull(),
    description: text("description").notNull(),
    location: text("location").notNull(),
    /** Measuring range and resolution as written on the instrument, with their units. */
    range: text("range"),
    resolution: text("resolution"),
    status: text("status", { enum: INSTRUMENT_STATUSES }).notNull().default("in_service"),
    /** Why it is out of service or retired. */
    statusReason: text("status_reason"),
    /** Months between calibrations; null for a test-ink set. */
    calibrationIntervalMonths: integer("calibration_interval_months"),
    /** A test-ink set's expiry date (YYYY-MM-DD); null for a calibrated instrument. */
    expiresOn: text("expires_on"),
    /**
     * The date it may be used until: the latest calibration's due date, or the ink set's expiry.
     * Kept on the row so the queue and the reminders read one index.
     */
    dueOn: text("due_on"),
    createdBy: text("created_by").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [
    index("instruments_status_due_idx").on(t.status, t.dueOn),
    index("instruments_kind_idx").on(t.kind),
  ],
);
export type Instrument = typeof instruments.$inferSelect;

/** One calibration: what was found, until when it holds, who did it and the certificate. */
export const instrumentCalibrations = sqliteTable(
  "instrument_calibrations",
  {
    id: id(),
    instrumentId: text("instrument_id")
      .notNull()
      .references(() => instruments.id),
    calibratedOn: text("calibrated_on").notNull(),
    dueOn: text("due_on").notNull(),
    performer: text("performer", { enum: CALIBRATION_PERFORMERS }).notNull(),
    /** The lab person or the external calibration lab. */
    performedBy: text("performed_by").notNull(),
    certificateNumber: text("certificate_number"),
    certificateFileId: text("certificate_file_id").references(() => evidenceFiles.id),
    result: text("result", { enum: CALIBRATION_RESULTS }).notNull(),
    note: text("note"),
    /** The nonconformance an out-of-tolerance result opened. */
    nonconformanceId: text("nonconformance_id"),
    recordedBy: text("recorded_by").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("instrument_calibrations_instrument_idx").on(t.instrumentId, t.calibratedOn)],
);
export type InstrumentCalibration = typeof instrumentCalibrations.$inferSelect;

/** The instruments a test run used; part of the run's signed content. */
export const testRunInstruments = sqliteTable(
  "test_run_instruments",
  {
    runId: text("run_id")
      .notNull()
      .references(() => testRuns.id),
    instrumentId: text("instrument_id")
      .notNull()
      .references(() => instruments.id),
  },
  (t) => [
    primaryKey({ columns: [t.runId, t.instrumentId] }),
    index("test_run_instruments_instrument_idx").on(t.instrumentId),
  ],
);

/** One overdue e-mail per instrument and due date. */
export const instrumentNotices = sqliteTable(
  "instrument_notices",
  {
    instrumentId: text("instrument_id")
      .notNull()
      .references(() => instruments.id),
    dueOn: text("due_on").notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("instrument_notices_uq").on(t.instrumentId, t.dueOn)],
);
