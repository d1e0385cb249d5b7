import { z } from "zod";
import "./messages";
import {
  INSTRUMENT_KINDS,
  INSTRUMENT_STATUSES,
  CALIBRATION_RESULTS,
} from "@/lib/instruments/kinds";
import { named, pageOf, pageQuery } from "./api";

/** GET /api/v1/instruments: the register by asset number, optionally one kind or status. */
export const instrumentsQuery = pageQuery
  .extend({
    kind: z.enum(INSTRUMENT_KINDS).optional().describe("Only instruments of this kind."),
    status: z.enum(INSTRUMENT_STATUSES).optional().describe("Only instruments in this status."),
  })
  .strict();

export const instrumentOut = named(
  "Instrument",
  z.object({
    id: z.string(),
    assetNumber: z.string(),
    kind: z.enum(INSTRUMENT_KINDS),
    description: z.string(),
    location: z.string(),
    range: z.string().nullable().describe("Measuring range as written, with its unit."),
    resolution: z.string().nullable(),
    status: z.enum(INSTRUMENT_STATUSES),
    statusReason: z.string().nullable().describe("Why it is out of service or retired."),
    calibrationIntervalMonths: z.number().int().nullable().describe("Null for a test-ink set."),
    expiresOn: z.string().nullable().describe("A test-ink set's expiry date (YYYY-MM-DD)."),
    dueOn: z
      .string()
      .nullable()
      .describe(
        "Usable up to and including this date: the latest calibration's due date or the ink set's expiry.",
      ),
    dueState: z
      .enum(["current", "due_soon", "overdue", "never_calibrated", "not_tracked"])
      .describe("Where it stands today (UTC); due_soon is within 30 days."),
    lastCalibration: z
      .object({
        calibratedOn: z.string(),
        dueOn: z.string(),
        result: z.enum(CALIBRATION_RESULTS),
      })
      .nullable(),
  }),
);
export type InstrumentOut = z.infer<typeof instrumentOut>;
export const instrumentPage = pageOf("InstrumentPage", instrumentOut);
