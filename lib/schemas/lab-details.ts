import { z } from "zod";
import "./messages";
import { WETTED_AREA_METHODS } from "@/db/enums";
import { storedText } from "./text";

/** Extraction procedures of technical cleanliness [std, ISO 16232:2018 / VDA 19.1:2015]. */
export const EXTRACTION_PROCEDURES = [
  "pressure_rinsing",
  "ultrasonic",
  "agitation",
  "internal_rinsing",
] as const;
export const EXTRACTION_PROCEDURE_LABELS: Record<(typeof EXTRACTION_PROCEDURES)[number], string> = {
  pressure_rinsing: "Pressure rinsing",
  ultrasonic: "Ultrasonic",
  agitation: "Agitation",
  internal_rinsing: "Internal rinsing",
};

export const ANALYSIS_SYSTEMS = [
  "light_microscope_manual",
  "light_microscope_automated",
  "sem_edx",
] as const;
export const ANALYSIS_SYSTEM_LABELS: Record<(typeof ANALYSIS_SYSTEMS)[number], string> = {
  light_microscope_manual: "Light microscope, manual",
  light_microscope_automated: "Light microscope, automated",
  sem_edx: "SEM/EDX",
};

/** The same words as the part family form uses for how its wetted area was found. */
export const WETTED_AREA_METHOD_LABELS: Record<(typeof WETTED_AREA_METHODS)[number], string> = {
  cad_model: "From the CAD model",
  measured: "Measured",
  calculated: "Calculated from the drawing",
  estimated: "Estimated",
};

export const PARTICLE_TYPES = ["metallic", "nonMetallic", "fibre"] as const;
export type ParticleType = (typeof PARTICLE_TYPES)[number];
export const PARTICLE_TYPE_LABELS: Record<ParticleType, string> = {
  metallic: "Metallic (reflective)",
  nonMetallic: "Non-metallic",
  fibre: "Fibre",
};

const empty = (v: unknown) =>
  v === undefined || v === null || (typeof v === "string" && v.trim() === "");
const toNumber = (v: unknown) =>
  empty(v) ? undefined : typeof v === "string" ? Number(v.trim().replace(",", ".")) : v;

function number(label: string, opts: { min?: number; above?: number; max: number; int?: boolean }) {
  let n = z.number({ error: `Enter ${label.toLowerCase()} as a number.` }).finite();
  if (opts.int) n = n.int(`${label} must be a whole number.`);
  if (opts.min !== undefined) n = n.min(opts.min, `${label} must be at least ${opts.min}.`);
  if (opts.above !== undefined) n = n.gt(opts.above, `${label} must be more than ${opts.above}.`);
  n = n.max(opts.max, `${label} must be at most ${opts.max}.`);
  return n;
}
const requiredNumber = (label: string, opts: Parameters<typeof number>[1]) =>
  z.preprocess(toNumber, number(label, opts));
const optionalNumber = (label: string, opts: Parameters<typeof number>[1]) =>
  z.preprocess(toNumber, number(label, opts).nullable().optional()).transform((v) => v ?? null);
const text = (what: string, max: number) =>
  storedText({ error: `Enter ${what}.` })
    .trim()
    .min(1, `Enter ${what}.`)
    .max(max);
const optionalText = (max: number) =>
  z
    .preprocess((v) => (empty(v) ? undefined : v), storedText().trim().max(max).optional())
    .transform((v) => v ?? null);

const largestParticle = z
  .object({
    lengthUm: optionalNumber("Length (µm)", { min: 5, max: 100_000 }),
    widthUm: optionalNumber("Width (µm)", { above: 0, max: 100_000 }),
    sampleLabel: optionalText(60),
    /** An evidence file of this run (photo or membrane image) that shows the particle. */
    photoFileId: z
      .preprocess((v) => (empty(v) ? undefined : v), z.uuid().optional())
      .transform((v) => v ?? null),
  })
  .superRefine((p, ctx) => {
    if (p.lengthUm === null) {
      for (const key of ["widthUm", "sampleLabel", "photoFileId"] as const)
        if (p[key] !== null)
          ctx.addIssue({
            code: "custom",
            path: ["lengthUm"],
            message: "Enter the length of the particle first.",
          });
      return;
    }
    if (p.widthUm !== null && p.widthUm > p.lengthUm)
      ctx.addIssue({
        code: "custom",
        path: ["widthUm"],
        message: "The width cannot exceed the length (the length is the maximum Feret diameter).",
      });
  });

/**
 * What a technical-cleanliness test report carries about how a run was made and on what
 * [std, ISO 16232:2018 / VDA 19.1:2015 test report contents]: the extraction and its parameters,
 * the filter, the analysis system, the component data and the largest particles by type.
 */
export const labDetailsSchema = z
  .object({
    component: z.object({
      drawingRevision: text("the drawing and its revision", 80),
      lot: text("the lot or batch of the parts tested", 80),
      wettedAreaCm2: requiredNumber("Wetted area per component (cm²)", {
        above: 0,
        max: 10_000_000,
      }),
      wettedAreaMethod: z.enum(WETTED_AREA_METHODS, {
        error: "Say how the wetted area was determined.",
      }),
    }),
    extraction: z.object({
      procedure: z.enum(EXTRACTION_PROCEDURES, { error: "Choose the extraction procedure." }),
      liquid: text("the extraction liquid", 120),
      volumeMl: requiredNumber("Liquid volume (mL)", { above: 0, max: 1_000_000 }),
      pressureBar: optionalNumber("Pressure (bar)", { above: 0, max: 1000 }),
      flowLPerMin: optionalNumber("Flow (L/min)", { above: 0, max: 1000 }),
      durationS: requiredNumber("Extraction time (s)", { above: 0, max: 86_400 }),
      controlledSurface: text("the controlled surface (what was extracted)", 300),
      extractions: requiredNumber("Number of extractions", { min: 1, max: 10, int: true }),
    }),
    filter: z.object({
      material: text("the filter membrane material", 80),
      poreSizeUm: requiredNumber("Pore size (µm)", { above: 0, max: 1000 }),
    }),
    analysis: z.object({
      system: z.enum(ANALYSIS_SYSTEMS, { error: "Choose the analysis system." }),
      // A magnification of zero (or below 1×) describes no optical system at all.
      magnification: requiredNumber("Magnification", { min: 1, max: 1_000_000 }),
      lowerSizeLimitUm: requiredNumber("Lower size limit (µm)", { min: 5, max: 3000 }),
    }),
    largest: z.object({
      metallic: largestParticle,
      nonMetallic: largestParticle,
      fibre: largestParticle,
    }),
  })
  .superRefine((d, ctx) => {
    // Pressure is what pressure and internal rinsing are set by [std, ISO 16232 extraction parameters].
    if (
      (d.extraction.procedure === "pressure_rinsing" ||
        d.extraction.procedure === "internal_rinsing") &&
      d.extraction.pressureBar === null
    )
      ctx.addIssue({
        code: "custom",
        path: ["extraction", "pressureBar"],
        message: "Enter the pressure: pressure and internal rinsing are set by it.",
      });
  });
export type LabDetails = z.output<typeof labDetailsSchema>;
