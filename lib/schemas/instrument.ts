import { z } from "zod";
import "./messages";
import {
  CALIBRATION_PERFORMERS,
  CALIBRATION_RESULTS,
  INSTRUMENT_KINDS,
} from "@/lib/instruments/kinds";
import { calendarDate } from "@/lib/schemas/date";
import { auditReason, storedText } from "@/lib/schemas/text";

const optionalText = (max: number) =>
  storedText()
    .trim()
    .max(max)
    .optional()
    .transform((v) => v || null);

const optionalDate = z
  .union([z.literal(""), calendarDate()])
  .optional()
  .transform((v) => v || null);

/** A whole number of months typed as text: empty means none (a test-ink set). */
const intervalMonths = z.preprocess(
  (v) => (typeof v === "string" ? (v.trim() === "" ? null : Number(v.trim())) : (v ?? null)),
  z
    .number({ error: "Enter a whole number of months." })
    .int("Enter a whole number of months.")
    .min(1, "The interval is at least 1 month.")
    .max(120, "The interval is at most 120 months.")
    .nullable(),
);

const instrumentFields = z.object({
  assetNumber: storedText()
    .trim()
    .min(1, "Enter the asset number.")
    .max(40)
    .regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/, "Use letters, digits, spaces and . _ / - only."),
  kind: z.enum(INSTRUMENT_KINDS, { error: "Choose the kind of instrument." }),
  description: storedText().trim().min(1, "Describe the instrument.").max(200),
  location: storedText().trim().min(1, "Say where it is kept.").max(120),
  range: optionalText(120),
  resolution: optionalText(120),
  calibrationIntervalMonths: intervalMonths,
  expiresOn: optionalDate,
});

/** A test-ink set has an expiry date; everything else a calibration interval. */
function dueRule(d: z.output<typeof instrumentFields>, ctx: z.RefinementCtx) {
  if (d.kind === "test_ink_set") {
    if (!d.expiresOn)
      ctx.addIssue({
        code: "custom",
        path: ["expiresOn"],
        message: "A test-ink set needs its expiry date.",
      });
    if (d.calibrationIntervalMonths !== null)
      ctx.addIssue({
        code: "custom",
        path: ["calibrationIntervalMonths"],
        message: "A test-ink set has an expiry date, not a calibration interval: leave it empty.",
      });
  } else {
    if (d.calibrationIntervalMonths === null)
      ctx.addIssue({
        code: "custom",
        path: ["calibrationIntervalMonths"],
        message: "Enter the calibration interval in months.",
      });
    if (d.expiresOn)
      ctx.addIssue({
        code: "custom",
        path: ["expiresOn"],
        message: "Only a test-ink set has an expiry date: leave it empty.",
      });
  }
}

/** The register entry, as the new-instrument form sends it. */
export const instrumentSchema = instrumentFields.superRefine(dueRule);
export type InstrumentInput = z.output<typeof instrumentSchema>;

/** Editing: the same fields, its id, and whether it is in service (with why not). */
export const instrumentEditSchema = instrumentFields
  .extend({
    instrumentId: z.uuid(),
    status: z.enum(["in_service", "out_of_service"], { error: "Choose in or out of service." }),
    statusReason: optionalText(1000),
  })
  .superRefine((d, ctx) => {
    dueRule(d, ctx);
    if (d.status === "out_of_service" && !d.statusReason)
      ctx.addIssue({
        code: "custom",
        path: ["statusReason"],
        message: "Say why it is out of service.",
      });
  });
export type InstrumentEditInput = z.output<typeof instrumentEditSchema>;

export const retireInstrumentSchema = z.object({
  instrumentId: z.uuid(),
  reason: auditReason(),
});

/** One calibration as the form records it; an empty due date takes the instrument's interval. */
export const calibrationSchema = z
  .object({
    instrumentId: z.uuid(),
    calibratedOn: calendarDate("Enter the calibration date."),
    dueOn: optionalDate,
    performer: z.enum(CALIBRATION_PERFORMERS, { error: "Choose who calibrated it." }),
    performedBy: storedText().trim().min(1, "Name the person or the calibration lab.").max(120),
    certificateNumber: optionalText(80),
    certificateFileId: z
      .union([z.literal(""), z.uuid()])
      .optional()
      .transform((v) => v || null),
    result: z.enum(CALIBRATION_RESULTS, { error: "Choose the result as found." }),
    note: optionalText(2000),
  })
  .superRefine((d, ctx) => {
    if (d.dueOn && d.dueOn <= d.calibratedOn)
      ctx.addIssue({
        code: "custom",
        path: ["dueOn"],
        message: "The due date must be after the calibration date.",
      });
  });
export type CalibrationInput = z.output<typeof calibrationSchema>;

/** The instruments a run used, ticked on the run page. */
export const citeInstrumentsSchema = z.object({
  runId: z.uuid(),
  instrumentIds: z
    .array(z.uuid({ error: "That instrument is not in the register." }))
    .max(30)
    .default([]),
});
