import { z } from "zod";
import "./messages";
import {
  CHARACTERISTICS,
  FREQUENCIES,
  isBathCharacteristic,
  takesMinCycles,
} from "@/lib/control-plans/characteristics";
import { isTimeZone } from "@/lib/control-plans/zone";
import { storedText } from "@/lib/schemas/text";

/**
 * A whole number typed as text; empty is null. Its lower bound is checked on the field itself, so
 * it is named in the same answer as every other field's mistake (a whole-line rule runs only once
 * each field reads).
 */
const count = (what: string, least = 0, tooFew = `${what} cannot be below ${least}.`) =>
  z.preprocess(
    (v) => (typeof v === "string" ? (v.trim() === "" ? null : Number(v)) : (v ?? null)),
    z
      .number({ error: `Enter ${what} as a whole number.` })
      .int(`Enter ${what} as a whole number.`)
      .min(least, tooFew.charAt(0).toUpperCase() + tooFew.slice(1))
      .max(10_000)
      .nullable(),
  );

export const controlPlanLineSchema = z
  .object({
    characteristic: z.enum(CHARACTERISTICS, { error: "Choose what is tested." }),
    method: storedText().trim().min(3, "Say how it is tested (at least 3 characters).").max(500),
    stageId: z
      .string()
      .trim()
      .transform((v) => (v === "" ? null : v))
      .pipe(z.uuid({ error: "Choose the tank." }).nullable()),
    sampleSize: count(
      "the sample size",
      1,
      "a sample size below 1 tests nothing: at least 1 part (or 1 reading).",
    ),
    minCycles: count("the number of cycles", 1, "at least 1 cycle."),
    frequency: z.enum(FREQUENCIES, { error: "Choose how often." }),
    everyN: count("N", 1, "N must be at least 1 cycle."),
    reactionPlan: storedText()
      .trim()
      .min(1, "Say what to do when a result is out: a line without a reaction plan is refused.")
      .max(2000),
  })
  .superRefine((line, ctx) => {
    const issue = (path: string, message: string) =>
      ctx.addIssue({ code: "custom", path: [path], message });
    if (line.sampleSize === null) issue("sampleSize", "Give the sample size.");
    if (line.frequency === "every_n_cycles") {
      if (line.everyN === null) issue("everyN", "Give N: every how many cycles.");
      else if (line.everyN > 500) issue("everyN", "At most every 500 cycles.");
    } else if (line.everyN !== null)
      issue("everyN", "N applies only to “every N cycles”: leave it empty.");
    if (isBathCharacteristic(line.characteristic)) {
      if (line.stageId === null) issue("stageId", "Choose the tank this value is read on.");
    } else if (line.stageId !== null)
      issue("stageId", "A test on parts names no tank: leave it empty.");
    if (takesMinCycles(line.characteristic)) {
      if (line.minCycles !== null && line.sampleSize !== null && line.minCycles > line.sampleSize)
        issue(
          "minCycles",
          "More distinct cycles than parts in the sample: each part is from one cycle.",
        );
    } else if (line.minCycles !== null)
      issue("minCycles", "Distinct cycles apply to tests on parts only: leave it empty.");
  })
  .transform((line) => ({
    ...line,
    sampleSize: line.sampleSize ?? 1,
    everyN: line.frequency === "every_n_cycles" ? line.everyN : null,
  }));
export type ControlPlanLineInput = z.output<typeof controlPlanLineSchema>;

const lines = z.array(controlPlanLineSchema).min(1, "Add at least one line.").max(40);

/** The new-plan form, sent whole as one JSON payload (its lines are a row list). */
export const createControlPlanSchema = z.object({
  combination: z
    .string()
    .regex(/^[0-9a-f-]{36}:[0-9a-f-]{36}$/, { error: "Choose the qualified combination." }),
  lines,
});
export type CreateControlPlanInput = z.output<typeof createControlPlanSchema>;

export const saveControlPlanDraftSchema = z.object({ versionId: z.uuid(), lines });
export type SaveControlPlanDraftInput = z.output<typeof saveControlPlanDraftSchema>;

export const reviseControlPlanSchema = z.object({
  planId: z.uuid(),
  note: storedText().trim().min(5, "Say why the plan changes (at least 5 characters).").max(500),
});

export const signControlPlanSchema = z.object({
  versionId: z.uuid(),
  password: z.string().min(1, "Enter your password to sign."),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
});

const hhmm = /^([01]\d|2[0-3]):[0-5]\d$/;

/** The site's shift starts ("06:00, 14:00, 22:00") and IANA time zone. */
export const siteClockSchema = z.object({
  siteId: z.uuid(),
  timeZone: z
    .string()
    .trim()
    .min(1)
    .max(64)
    .refine(isTimeZone, "Not a time zone this server knows: use a name such as Europe/Berlin."),
  shiftStarts: z
    .string()
    .max(200)
    .transform((s) =>
      s
        .split(/[,\s]+/)
        .map((t) => t.trim())
        .filter(Boolean),
    )
    .pipe(
      z
        .array(z.string().regex(hhmm, "Write each start as HH:MM, e.g. 06:00, 14:00, 22:00."))
        .min(1, "Give at least one shift start.")
        .max(6, "At most 6 shifts a day.")
        .refine((a) => new Set(a).size === a.length, "A start time is listed twice."),
    )
    .transform((a) => [...a].sort()),
});
export type SiteClockInput = z.output<typeof siteClockSchema>;
