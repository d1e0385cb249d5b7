import { z } from "zod";
import "./messages";
import { RISK_LEVELS } from "@/lib/deviations/rules";
import { calendarDate } from "@/lib/schemas/date";
import { auditReason, storedText } from "@/lib/schemas/text";

/** A limit typed as text: empty means "no limit". */
const optionalLimit = z.preprocess(
  (v) =>
    typeof v === "string" ? (v.trim() === "" ? null : Number(v.replace(",", "."))) : (v ?? null),
  z
    .number({ error: "Enter a number or leave empty." })
    .finite("Enter a number or leave empty.")
    .nullable(),
);
const optionalCount = z.preprocess(
  (v) => (typeof v === "string" ? (v.trim() === "" ? null : Number(v)) : (v ?? null)),
  z
    .number({ error: "Enter a whole number or leave empty." })
    .int("Enter a whole number or leave empty.")
    .min(1)
    .max(10_000)
    .nullable(),
);

export const deviationParameterSchema = z.object({
  key: z.string().trim().min(1, "Choose the parameter."),
  temporaryLow: optionalLimit,
  temporaryHigh: optionalLimit,
});

/** The new-deviation form, sent whole as one JSON payload (its parameters are a row list). */
export const deviationSchema = z
  .object({
    recipeId: z.uuid({ error: "Choose the recipe." }),
    title: storedText()
      .trim()
      .min(5, "Say what the deviation permits (at least 5 characters).")
      .max(200),
    justification: storedText()
      .trim()
      .min(10, "Say why it is needed (at least 10 characters).")
      .max(4000),
    riskLevel: z.enum(RISK_LEVELS, { error: "Choose the risk level." }),
    risk: storedText()
      .trim()
      .min(10, "Describe the risk and how it is contained (at least 10 characters).")
      .max(4000),
    endsOn: z.union([z.literal(""), calendarDate()]).transform((v) => (v === "" ? null : v)),
    maxLots: optionalCount,
    reminderDays: z.preprocess(
      (v) => (typeof v === "string" && v.trim() !== "" ? Number(v) : v),
      z.number({ error: "Enter a whole number of days." }).int().min(0).max(60),
    ),
    partFamilyIds: z.array(z.uuid()).min(1, "Choose at least one part family."),
    parameters: z.array(deviationParameterSchema).min(1, "Add at least one parameter."),
  })
  .superRefine((d, ctx) => {
    if (d.endsOn === null && d.maxLots === null)
      ctx.addIssue({
        code: "custom",
        path: ["endsOn"],
        message: "Give an end date, a number of lots, or both: a deviation must end.",
      });
    const seen = new Set<string>();
    d.parameters.forEach((p, i) => {
      if (seen.has(p.key))
        ctx.addIssue({
          code: "custom",
          path: ["parameters", i, "key"],
          message: "This parameter is listed twice.",
        });
      seen.add(p.key);
    });
  });
export type DeviationInput = z.output<typeof deviationSchema>;

export const deviationIdSchema = z.object({ deviationId: z.uuid() });

export const signDeviationSchema = deviationIdSchema.extend({
  password: z.string().min(1, "Enter your password to sign."),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
});

export const withdrawDeviationSchema = deviationIdSchema.extend({ reason: auditReason() });

export const recordLotSchema = deviationIdSchema.extend({
  lot: storedText().trim().min(1, "Give the lot number.").max(60),
});

export const deviationListSchema = z.object({
  state: z.enum(["all", "draft", "active", "expired", "withdrawn"]).catch("all"),
  recipe: z.string().max(60).catch(""),
});
