import { z } from "zod";
import "./messages";
import type { LabMethodKind } from "@/db/enums";
import {
  analysisMethodProblems,
  extractionMethodProblems,
  gravimetricMethodProblems,
  PARTICLE_DISTINCTIONS,
  type FieldProblem,
} from "@/lib/lab-methods/rules";
import { calendarDate } from "./date";
import { ANALYSIS_SYSTEMS, EXTRACTION_PROCEDURES } from "./lab-details";
import { storedText } from "./text";

export const LAB_METHOD_KIND_LABELS: Record<LabMethodKind, string> = {
  extraction: "Extraction procedure",
  analysis: "Analysis method",
  gravimetric: "Gravimetric method",
};

const empty = (v: unknown) =>
  v === undefined || v === null || (typeof v === "string" && v.trim() === "");
const toNumber = (v: unknown) =>
  empty(v) ? undefined : typeof v === "string" ? Number(v.trim().replace(",", ".")) : v;
function number(label: string, opts: { min?: number; max: number; int?: boolean }) {
  let n = z.number({ error: `Enter ${label.toLowerCase()} as a number.` }).finite();
  if (opts.int) n = n.int(`${label} must be a whole number.`);
  if (opts.min !== undefined) n = n.min(opts.min, `${label} must be at least ${opts.min}.`);
  return n.max(opts.max, `${label} must be at most ${opts.max}.`);
}
const positive = (label: string, max: number) =>
  z.preprocess(toNumber, number(label, { max }).gt(0, `${label} must be more than 0.`));
const optionalPositive = (label: string, max: number) =>
  z
    .preprocess(
      toNumber,
      number(label, { max }).gt(0, `${label} must be more than 0.`).nullable().optional(),
    )
    .transform((v) => v ?? null);
const text = (what: string, max: number) =>
  storedText({ error: `Enter ${what}.` })
    .trim()
    .min(1, `Enter ${what}.`)
    .max(max);

export const extractionDetailsSchema = z.object({
  procedure: z.enum(EXTRACTION_PROCEDURES, { error: "Choose the extraction procedure." }),
  liquid: text("the extraction liquid", 120),
  volumeMl: positive("Liquid volume (mL)", 1_000_000),
  pressureBar: optionalPositive("Pressure (bar)", 1000),
  flowLPerMin: optionalPositive("Flow (L/min)", 1000),
  durationS: positive("Extraction time (s)", 86_400),
  controlledSurface: text("the controlled surface", 300),
  extractions: z.preprocess(
    toNumber,
    number("Number of extractions", { min: 1, max: 10, int: true }),
  ),
});

export const analysisDetailsSchema = z.object({
  filterMaterial: text("the filter membrane material", 80),
  poreSizeUm: positive("Pore size (µm)", 1000),
  system: z.enum(ANALYSIS_SYSTEMS, { error: "Choose the analysis system." }),
  // Zero is let through here so the method rule names it with its reason.
  magnification: z.preprocess(toNumber, number("Magnification", { min: 0, max: 1_000_000 })),
  lowerSizeLimitUm: z.preprocess(toNumber, number("Lower size limit (µm)", { min: 5, max: 3000 })),
  distinguishes: z.preprocess(
    (v) => (empty(v) ? [] : Array.isArray(v) ? v : [v]),
    z.array(z.enum(PARTICLE_DISTINCTIONS)).max(PARTICLE_DISTINCTIONS.length),
  ),
});

export const gravimetricDetailsSchema = z.object({
  filterMaterial: text("the filter membrane material", 80),
  poreSizeUm: positive("Pore size (µm)", 1000),
  balanceResolutionMg: positive("Balance resolution (mg)", 10),
  dryingTemperatureC: positive("Drying temperature (°C)", 200),
  dryingTimeMin: positive("Drying time (min)", 1440),
  weighingConditions: text("the weighing conditions (cooling, climate)", 300),
  practicalLowerLimitMg: positive("Practical lower limit (mg)", 1000),
  poolingRule: text("the pooling rule", 300),
});
export type ExtractionDetails = z.output<typeof extractionDetailsSchema>;
export type AnalysisDetails = z.output<typeof analysisDetailsSchema>;
export type GravimetricDetails = z.output<typeof gravimetricDetailsSchema>;

const common = {
  code: storedText()
    .trim()
    .min(2)
    .max(40)
    .regex(/^[A-Za-z0-9][A-Za-z0-9._-]*$/, "Use letters, digits, dots and dashes (e.g. EX-01)."),
  name: text("the method's name", 160),
  trainingIntervalMonths: z.preprocess(
    toNumber,
    number("Training interval (months)", { min: 1, max: 120, int: true }),
  ),
  qualificationRunId: z
    .preprocess((v) => (empty(v) ? undefined : v), z.uuid().optional())
    .transform((v) => v ?? null),
};

/** The method form: one version's fields; the rules between fields are `lib/lab-methods/rules.ts`. */
export const labMethodSchema = z
  .discriminatedUnion(
    "kind",
    [
      z.object({ kind: z.literal("extraction"), ...common, details: extractionDetailsSchema }),
      z.object({ kind: z.literal("analysis"), ...common, details: analysisDetailsSchema }),
      z.object({ kind: z.literal("gravimetric"), ...common, details: gravimetricDetailsSchema }),
    ],
    { error: "Choose the kind of method." },
  )
  .superRefine((m, ctx) => {
    for (const p of labMethodProblems(m))
      ctx.addIssue({ code: "custom", path: p.field.split("."), message: p.message });
  });
export type LabMethodInput = z.output<typeof labMethodSchema>;

export function labMethodProblems(m: LabMethodInput): FieldProblem[] {
  if (m.kind === "extraction") return extractionMethodProblems(m.details);
  if (m.kind === "analysis") return analysisMethodProblems(m.details);
  return gravimetricMethodProblems(m.details);
}

export const methodIdSchema = z.object({ methodId: z.uuid() });
export const approveMethodSchema = methodIdSchema.extend({
  password: z.string().min(1, "Enter your password to sign."),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
});

const optionalMethod = z
  .preprocess((v) => (empty(v) ? undefined : v), z.uuid().optional())
  .transform((v) => v ?? null);
/** The method versions a run cites, one per kind; empty means none of that kind. */
export const citeMethodsSchema = z.object({
  runId: z.uuid(),
  extraction: optionalMethod,
  analysis: optionalMethod,
  gravimetric: optionalMethod,
});
export type CiteMethodsInput = z.output<typeof citeMethodsSchema>;

export const trainingSignOffSchema = z.object({
  userId: z.uuid({ error: "Choose the person trained." }),
  methodCode: storedText().trim().min(1, "Choose the method.").max(40),
  trainedOn: calendarDate(),
  password: z.string().min(1, "Enter your password to sign."),
});
export const acknowledgeProcedureSchema = z.object({
  documentVersionId: z.uuid({ error: "Choose the procedure." }),
  password: z.string().min(1, "Enter your password to sign."),
});

/**
 * What the method form's action reads before the whole method: its kind, and the ticked
 * distinctions (a list of checkboxes, which only a top-level field keeps whole).
 */
export const methodFormSchema = z.object({
  kind: z.enum(["extraction", "analysis", "gravimetric"], { error: "Choose the kind of method." }),
  distinguishes: z.array(z.string().max(40)).max(10).default([]),
});
