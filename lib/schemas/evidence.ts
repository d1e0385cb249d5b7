import { z } from "zod";
import "./messages";
import { calendarDate, calendarDateTime } from "./date";
import { todayUtc } from "@/lib/format/date";
import { auditReason, optionalAuditReason, storedText } from "@/lib/schemas/text";
import {
  BATH_RECORD_KINDS,
  CHECK_RESULTS,
  EVIDENCE_FILE_KINDS,
  MAINTENANCE_KINDS,
  TEST_TYPES,
} from "@/db/enums";

/** ISO 16232 size classes B…N, as form field suffixes and CSV columns. */
export const CLASS_KEYS = [
  "B",
  "C",
  "D",
  "E",
  "F",
  "G",
  "H",
  "I",
  "J",
  "K",
  "L",
  "M",
  "N",
] as const;
export type ClassKey = (typeof CLASS_KEYS)[number];

const blank = (v: unknown) =>
  v === undefined || v === null || (typeof v === "string" && v.trim() === "");
const toNumber = (v: unknown) =>
  blank(v) ? undefined : typeof v === "string" ? Number(v.trim().replace(",", ".")) : v;

/** An optional number typed into a form: empty means "not measured". */
export function optionalNumber(
  label: string,
  opts: { min?: number; max?: number; int?: boolean } = {},
) {
  let n = z.number({ error: `${label} must be a number.` }).finite(`${label} must be a number.`);
  if (opts.int) n = n.int(`${label} must be a whole number.`);
  if (opts.min !== undefined) n = n.min(opts.min, `${label} must be at least ${opts.min}.`);
  if (opts.max !== undefined) n = n.max(opts.max, `${label} must be at most ${opts.max}.`);
  return z.preprocess(toNumber, n.optional());
}
export function requiredNumber(
  label: string,
  opts: { min?: number; max?: number; int?: boolean } = {},
) {
  let n = z.number({ error: `Enter ${label.toLowerCase()}.` }).finite(`${label} must be a number.`);
  if (opts.int) n = n.int(`${label} must be a whole number.`);
  if (opts.min !== undefined) n = n.min(opts.min, `${label} must be at least ${opts.min}.`);
  if (opts.max !== undefined) n = n.max(opts.max, `${label} must be at most ${opts.max}.`);
  return z.preprocess(toNumber, n);
}
export const optionalText = (max: number) =>
  z.preprocess(
    (v) => (blank(v) ? undefined : v),
    storedText().trim().max(max, `Use at most ${max} characters.`).optional(),
  );
const checkbox = z.preprocess(
  (v) => v === true || v === "on" || v === "true" || v === "yes" || v === "1",
  z.boolean(),
);

/** A list typed as "1200, 310, 95" or one value per line. */
function numberList(
  label: string,
  opts: { min: number; max: number; minItems: number; maxItems: number; int?: boolean },
) {
  return z.preprocess(
    (v) => {
      if (Array.isArray(v)) return v.map(toNumber);
      if (blank(v)) return [];
      return String(v)
        .split(/[;,\s]+/)
        .filter((s) => s !== "")
        .map(Number);
    },
    z
      .array(
        (opts.int ? z.number().int(`Each ${label} must be a whole number.`) : z.number())
          .refine(Number.isFinite, `Each ${label} must be a number.`)
          .min(opts.min, `Each ${label} must be at least ${opts.min}.`)
          .max(opts.max, `Each ${label} must be at most ${opts.max}.`),
        { error: `Enter the ${label}s as numbers separated by commas.` },
      )
      .min(
        opts.minItems,
        `Enter at least ${opts.minItems} ${label}${opts.minItems === 1 ? "" : "s"}.`,
      )
      .max(opts.maxItems, `Enter at most ${opts.maxItems} ${label}s.`),
  );
}

/** Absolute particle counts per size class; a class left empty was counted as 0. */
export const countsSchema = z
  .object(
    Object.fromEntries(
      CLASS_KEYS.map((k) => [
        k,
        optionalNumber(`Class ${k} count`, { min: 0, int: true, max: 1e9 }),
      ]),
    ) as Record<ClassKey, ReturnType<typeof optionalNumber>>,
  )
  .transform(
    (c) =>
      Object.fromEntries(
        CLASS_KEYS.filter((k) => c[k] !== undefined && c[k] !== 0).map((k) => [k, c[k] as number]),
      ) as Partial<Record<ClassKey, number>>,
  );
export type Counts = z.output<typeof countsSchema>;

const sampleBase = z.object({
  sampleLabel: storedText({ error: "Enter the sample's part serial or label." })
    .trim()
    .min(1, "Enter the sample's part serial or label.")
    .max(60, "Use at most 60 characters."),
  /** The washer's cycle id the part came out of: samples from distinct cycles are independent. */
  cycleNumber: z.preprocess(
    (v) => (blank(v) ? undefined : v),
    storedText()
      .trim()
      .max(60, "Use at most 60 characters.")
      .regex(
        /^[A-Za-z0-9][A-Za-z0-9._/-]*$/,
        "Enter the washer's cycle id as printed: it starts with a letter or digit (not a minus sign).",
      )
      .optional(),
  ),
  basketPosition: optionalText(60),
  worstCase: checkbox,
});

const largestSchema = z.object({
  metallicUm: optionalNumber("Largest metallic particle (µm)", { min: 5, max: 100_000 }),
  nonMetallicUm: optionalNumber("Largest non-metallic particle (µm)", { min: 5, max: 100_000 }),
  fibreUm: optionalNumber("Largest fibre (µm)", { min: 5, max: 100_000 }),
});

/** One sample of a particle cleanliness test (ISO 16232): counts per class, optionally split by particle type. */
export const particleSampleSchema = sampleBase
  .extend({
    components: requiredNumber("Components in the sample", { min: 1, max: 10_000, int: true }),
    counts: countsSchema,
    splitMeasured: checkbox,
    metallic: countsSchema.optional(),
    nonMetallic: countsSchema.optional(),
    fibre: countsSchema.optional(),
    largest: largestSchema,
  })
  .superRefine((s, ctx) => {
    if (!s.splitMeasured) return;
    for (const k of CLASS_KEYS) {
      const sum = (s.metallic?.[k] ?? 0) + (s.nonMetallic?.[k] ?? 0) + (s.fibre?.[k] ?? 0);
      if (sum !== (s.counts[k] ?? 0)) {
        ctx.addIssue({
          code: "custom",
          path: ["counts", k],
          message: `Metallic + non-metallic + fibre in class ${k} is ${sum}, but the total is ${s.counts[k] ?? 0}.`,
        });
      }
    }
  })
  .transform(({ splitMeasured, metallic, nonMetallic, fibre, ...rest }) => ({
    ...rest,
    split: splitMeasured
      ? { metallic: metallic ?? {}, nonMetallic: nonMetallic ?? {}, fibre: fibre ?? {} }
      : null,
  }));
export type ParticleSample = z.output<typeof particleSampleSchema>;

/** Run-level data of a particle test: the declining test (extraction series) and the blank. */
export const particleRunDataSchema = z
  .object({
    extractionSeries: numberList("extraction count", {
      min: 0,
      max: 1e9,
      minItems: 0,
      maxItems: 10,
      int: true,
    }),
    blankMeasured: checkbox,
    // The form shows the blank counts only once the box is ticked, so they may be absent.
    blankCounts: countsSchema.optional(),
    blankLargestUm: optionalNumber("Largest blank particle (µm)", { min: 5, max: 100_000 }),
  })
  .refine((d) => d.blankMeasured, {
    path: ["blankMeasured"],
    message:
      "Tick “Blank value measured” and enter the blank counts: the extraction series is saved together with its blank.",
  })
  .transform(({ blankMeasured, blankCounts, blankLargestUm, extractionSeries }) => ({
    extractionSeries,
    blank: blankMeasured ? { counts: blankCounts ?? {}, largestUm: blankLargestUm ?? null } : null,
  }));
export type ParticleRunData = z.output<typeof particleRunDataSchema>;

/**
 * The same extraction series and blank as an instrument sends them over the API: JSON
 * numbers rather than form text, and the blank required, as the form requires it.
 */
export const particleRunDataApiSchema = z
  .object({
    extractionSeries: z
      .array(z.number().int().min(0).max(1e9))
      .max(10)
      .describe("Counts of the successive extractions of the declining test (ISO 16232), in order"),
    blank: z.object({
      counts: countsSchema.describe("Blank counts per size class (B … N); a class left out is 0"),
      largestUm: z.number().min(5).max(100_000).nullable().default(null),
    }),
  })
  .transform(({ extractionSeries, blank }): ParticleRunData => ({
    extractionSeries,
    blank: { counts: blank.counts, largestUm: blank.largestUm },
  }));

export const gravimetricSampleSchema = sampleBase
  .extend({
    components: requiredNumber("Components filtered", { min: 1, max: 10_000, int: true }),
    filterBeforeMg: requiredNumber("Filter mass before (mg)", { min: 0, max: 100_000 }),
    filterAfterMg: requiredNumber("Filter mass after (mg)", { min: 0, max: 100_000 }),
    blankMg: optionalNumber("Blank residue (mg)", { min: 0, max: 100_000 }),
  })
  .refine((s) => s.filterAfterMg >= s.filterBeforeMg, {
    path: ["filterAfterMg"],
    message: "The filter after filtration cannot be lighter than before; check the weighing.",
  });
export type GravimetricSample = z.output<typeof gravimetricSampleSchema>;

export const wettingSampleSchema = sampleBase.extend({
  readingsMNm: numberList("test-ink reading", { min: 18, max: 105, minItems: 1, maxItems: 20 }),
});
export type WettingSample = z.output<typeof wettingSampleSchema>;

export const conductivitySampleSchema = sampleBase.extend({
  measuredUsPerCm: requiredNumber("Measured conductivity (µS/cm)", { min: 0, max: 200_000 }),
  temperatureC: requiredNumber("Water temperature (°C)", { min: 0, max: 100 }),
});
export type ConductivitySample = z.output<typeof conductivitySampleSchema>;

/** Visual (stain-free), UV (oil film) and dryness: what the technician saw, backed by photos. */
export const observationSampleSchema = sampleBase.extend({
  acceptable: z
    .enum(["yes", "no"], { error: "Say whether the sample meets the criterion." })
    .transform((v) => v === "yes"),
  observation: optionalText(1000),
});
export type ObservationSample = z.output<typeof observationSampleSchema>;

export type TestType = (typeof TEST_TYPES)[number];

export const SAMPLE_SCHEMAS = {
  particle_cleanliness: particleSampleSchema,
  gravimetric: gravimetricSampleSchema,
  wetting_tension: wettingSampleSchema,
  rinse_conductivity: conductivitySampleSchema,
  visual: observationSampleSchema,
  uv_inspection: observationSampleSchema,
  dryness: observationSampleSchema,
} as const satisfies Record<TestType, z.ZodType>;

const uuid = z.string().uuid("Choose from the list.");
const optionalUuid = z.preprocess((v) => (blank(v) ? undefined : v), uuid.optional());

function latestToday(now = new Date()): string {
  return todayUtc(new Date(now.getTime() + 24 * 3_600_000));
}

export const createRunSchema = z.object({
  partFamilyId: uuid,
  recipeVersionId: uuid,
  testType: z.enum(TEST_TYPES, { error: "Choose the test type." }),
  technicianId: uuid,
  lab: storedText({ error: "Name the analysing lab." })
    .trim()
    .min(2, "Name the analysing lab.")
    .max(120),
  // A test is recorded on or after the day it was done. The UTC date plus one is today somewhere
  // on Earth (a plant east of Greenwich is a day ahead of UTC in its morning).
  performedOn: calendarDate("Enter the test date.").refine(
    (d) => d <= latestToday(),
    "The test date cannot be in the future.",
  ),
  protocolDocumentId: optionalUuid,
  changeRequestId: optionalUuid,
  requirement: optionalText(120),
});
export type CreateRun = z.output<typeof createRunSchema>;

export const runIdSchema = z.object({ runId: uuid });
export const sampleIdSchema = z.object({ runId: uuid, sampleId: uuid });
/** A removed sample stays in the audit trail with why it went: typed in error, wrong part, damaged. */
export const removeSampleSchema = sampleIdSchema.extend({ reason: auditReason() });

export const signRunSchema = z.object({
  runId: uuid,
  meaning: z.enum(["performed", "verified"]),
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
  password: z.string().min(1, "Enter your password."),
});

export const reviseRunSchema = z.object({
  runId: uuid,
  reason: storedText({ error: "Give the reason for the correction." })
    .trim()
    .min(5, "Give the reason for the correction (at least 5 characters).")
    .max(1000),
});

export const fileKindSchema = z.enum(EVIDENCE_FILE_KINDS);

/** The fields that travel beside an uploaded file, from the run page and from the API alike. */
export const evidenceFileFieldsSchema = z.object({
  kind: fileKindSchema,
  sampleLabel: z.preprocess(
    (v) => (v === "" || v === null ? undefined : v),
    storedText().trim().max(60).optional(),
  ),
});
/** Every field an upload form may carry; the API refuses any other by name. */
export const EVIDENCE_FILE_FORM_KEYS = ["file", "kind", "sampleLabel"] as const;

export const detachFileSchema = z.object({
  runId: uuid,
  fileId: uuid,
  reason: storedText({ error: "Give the reason for detaching the file." })
    .trim()
    .min(5, "Give the reason for detaching the file (at least 5 characters).")
    .max(500, "Use at most 500 characters."),
});

// ── Bath and filter log ─────────────────────────────────────────────────

export const bathRecordSchema = z
  .object({
    stageId: uuid,
    kind: z.enum(BATH_RECORD_KINDS, { error: "Choose what was done." }),
    performedAt: calendarDateTime("Enter when it was done."),
    concentrationPct: optionalNumber("Detergent concentration (%)", { min: 0, max: 100 }),
    conductivityUsPerCm: optionalNumber("Bath conductivity (µS/cm)", { min: 0, max: 200_000 }),
    temperatureC: optionalNumber("Bath temperature (°C)", { min: 0, max: 100 }),
    countPerMl4: optionalNumber("Particles ≥ 4 µm(c) per mL", { min: 0, max: 1e9 }),
    countPerMl6: optionalNumber("Particles ≥ 6 µm(c) per mL", { min: 0, max: 1e9 }),
    countPerMl14: optionalNumber("Particles ≥ 14 µm(c) per mL", { min: 0, max: 1e9 }),
    ph: optionalNumber("pH", { min: 0, max: 14 }),
    oilContentGPerL: optionalNumber("Oil content (g/L)", { min: 0, max: 1000 }),
    // A titration: the concentration is computed from the volume and the detergent's factor.
    titrantVolumeMl: optionalNumber("Titrant volume (mL)", { min: 0, max: 1000 }),
    detergentId: z.preprocess(
      (v) => (blank(v) ? undefined : v),
      z.uuid("Choose the detergent from the list.").optional(),
    ),
    additionQuantity: optionalNumber("Quantity added", { min: 0, max: 100_000 }),
    additionUnit: z.preprocess(
      (v) => (blank(v) ? undefined : v),
      z.enum(["L", "kg"], { error: "Choose L or kg." }).optional(),
    ),
    additionLot: optionalText(100),
    filterDescription: optionalText(200),
    filterRatingUm: optionalNumber("Filter rating (µm)", { min: 0, max: 10_000 }),
    differentialPressureBar: optionalNumber("Differential pressure (bar)", { min: 0, max: 100 }),
    checkResult: z.preprocess(
      (v) => (blank(v) ? undefined : v),
      z.enum(CHECK_RESULTS, { error: "Choose pass or fail." }).optional(),
    ),
    photoFileId: z.preprocess(
      (v) => (blank(v) ? undefined : v),
      z.uuid("Upload the photo again.").optional(),
    ),
    notes: optionalText(1000),
  })
  .superRefine((r, ctx) => {
    if (r.titrantVolumeMl !== undefined && r.concentrationPct !== undefined)
      ctx.addIssue({
        code: "custom",
        path: ["concentrationPct"],
        message:
          "Enter the titrant volume or the concentration, not both: the titration gives the concentration.",
      });
    if (r.kind === "addition" && (r.additionQuantity === undefined || !r.additionLot))
      ctx.addIssue({
        code: "custom",
        path: [r.additionQuantity === undefined ? "additionQuantity" : "additionLot"],
        message: "A top-up needs the quantity added and the detergent lot.",
      });
    if (r.additionQuantity !== undefined && !r.additionUnit)
      ctx.addIssue({ code: "custom", path: ["additionUnit"], message: "Choose L or kg." });
    if (
      r.kind === "filter_change" &&
      (r.filterRatingUm === undefined || r.differentialPressureBar === undefined)
    )
      ctx.addIssue({
        code: "custom",
        path: [r.filterRatingUm === undefined ? "filterRatingUm" : "differentialPressureBar"],
        message:
          "A filter change records the filter's rating (µm) and the differential pressure before the change (bar).",
      });
    if ((r.kind === "nozzle_check" || r.kind === "ultrasonic_foil_test") && !r.checkResult)
      ctx.addIssue({ code: "custom", path: ["checkResult"], message: "Choose pass or fail." });
    const counts = [r.countPerMl4, r.countPerMl6, r.countPerMl14];
    const given = counts.filter((c) => c !== undefined).length;
    if (given !== 0 && given !== 3)
      ctx.addIssue({
        code: "custom",
        path: ["countPerMl4"],
        message: "Enter all three particle counter channels (≥ 4, ≥ 6, ≥ 14 µm(c)) or none.",
      });
    if (given === 3 && !(r.countPerMl4! >= r.countPerMl6! && r.countPerMl6! >= r.countPerMl14!)) {
      ctx.addIssue({
        code: "custom",
        path: ["countPerMl6"],
        message: "Cumulative counts fall with size: ≥ 4 µm ≥ ≥ 6 µm ≥ ≥ 14 µm.",
      });
    }
    if (
      r.kind === "reading" &&
      given === 0 &&
      [
        r.concentrationPct,
        r.titrantVolumeMl,
        r.ph,
        r.oilContentGPerL,
        r.conductivityUsPerCm,
        r.temperatureC,
      ].every((v) => v === undefined)
    ) {
      ctx.addIssue({
        code: "custom",
        path: ["concentrationPct"],
        message: "A reading needs at least one measured value.",
      });
    }
  });
export type BathRecordInput = z.output<typeof bathRecordSchema>;

export const maintenanceIntervalSchema = z.object({
  stageId: uuid,
  kind: z.enum(MAINTENANCE_KINDS, { error: "Choose the kind of maintenance." }),
  intervalDays: requiredNumber("Interval (days)", { min: 1, max: 730, int: true }),
  warnDays: requiredNumber("Warn before (days)", { min: 0, max: 60, int: true }),
  // Required by the service once the interval exists: the first value needs none.
  reason: optionalAuditReason(),
});
export type MaintenanceIntervalInput = z.output<typeof maintenanceIntervalSchema>;

/** FormData with dotted names ("counts.B") as a nested object for the schemas above. */
export function formToObject(formData: FormData): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [name, value] of formData.entries()) {
    const path = name.split(".");
    // A crafted name must not reach Object.prototype ("__proto__.x") or crash on a path through a value ("a" and "a.b").
    if (
      typeof value !== "string" ||
      name.startsWith("$ACTION") ||
      path.some((p) => UNSAFE_KEYS.has(p))
    )
      continue;
    let node = out;
    for (const part of path.slice(0, -1)) {
      const next = node[part];
      node = (typeof next === "object" && next !== null ? next : (node[part] = {})) as Record<
        string,
        unknown
      >;
    }
    node[path[path.length - 1]] = value;
  }
  return out;
}

const UNSAFE_KEYS = new Set(["__proto__", "constructor", "prototype"]);
