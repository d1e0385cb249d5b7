import { SIZE_CLASSES } from "@/lib/cleanliness";
import { countedBelowLimit } from "@/lib/lab-report/analysed-classes";

export interface FieldProblem {
  field: string;
  message: string;
}

/** What an analysis system can tell apart on a membrane. */
export const PARTICLE_DISTINCTIONS = ["reflective", "non_reflective", "fibre", "metallic"] as const;
export type ParticleDistinction = (typeof PARTICLE_DISTINCTIONS)[number];
export const PARTICLE_DISTINCTION_LABELS: Record<ParticleDistinction, string> = {
  reflective: "Reflective",
  non_reflective: "Non-reflective",
  fibre: "Fibre",
  metallic: "Metallic (by element analysis)",
};

export interface AnalysisFields {
  filterMaterial: string;
  poreSizeUm: number;
  system: "light_microscope_manual" | "light_microscope_automated" | "sem_edx";
  magnification: number;
  lowerSizeLimitUm: number;
  distinguishes: readonly ParticleDistinction[];
}

/**
 * Checks an analysis method's fields against each other [std, ISO 16232:2018 / VDA 19.1:2015
 * analysis methods]: a light microscope sees reflection, not composition, so "metallic" needs
 * element analysis (SEM/EDX); a magnification describes an optical system only above 0×; a
 * filter whose pores are larger than the lower size limit lets particles of that size through
 * [practice: the pore size is at most the smallest size analysed].
 */
export function analysisMethodProblems(a: AnalysisFields, prefix = "details."): FieldProblem[] {
  const problems: FieldProblem[] = [];
  if (!(a.magnification > 0))
    problems.push({
      field: `${prefix}magnification`,
      message: "Magnification must be more than 0×: enter the magnification the analysis uses.",
    });
  if (a.distinguishes.includes("metallic") && a.system !== "sem_edx")
    problems.push({
      field: `${prefix}distinguishes`,
      message:
        "Only SEM/EDX tells metallic particles apart; a light microscope sees reflective and non-reflective particles.",
    });
  if (a.distinguishes.length === 0)
    problems.push({
      field: `${prefix}distinguishes`,
      message: "Tick at least one kind of particle the system tells apart.",
    });
  if (a.poreSizeUm > a.lowerSizeLimitUm)
    problems.push({
      field: `${prefix}poreSizeUm`,
      message: `The pore size must not exceed the lower size limit (${a.lowerSizeLimitUm} µm), or particles of that size pass the filter.`,
    });
  return problems;
}

export interface ExtractionFields {
  procedure: "pressure_rinsing" | "ultrasonic" | "agitation" | "internal_rinsing";
  pressureBar: number | null;
  flowLPerMin: number | null;
}

/** Pressure and internal rinsing are set by pressure and flow [std, ISO 16232 extraction parameters]. */
export function extractionMethodProblems(e: ExtractionFields, prefix = "details."): FieldProblem[] {
  const problems: FieldProblem[] = [];
  if (e.procedure === "pressure_rinsing" || e.procedure === "internal_rinsing") {
    if (e.pressureBar === null)
      problems.push({
        field: `${prefix}pressureBar`,
        message: "Enter the pressure: pressure and internal rinsing are set by it.",
      });
    if (e.flowLPerMin === null)
      problems.push({
        field: `${prefix}flowLPerMin`,
        message: "Enter the flow: pressure and internal rinsing are set by it.",
      });
  }
  return problems;
}

export interface GravimetricFields {
  balanceResolutionMg: number;
  practicalLowerLimitMg: number;
}

/**
 * A balance reads residue meaningfully only well above its resolution [std, ISO 16232 gravimetry:
 * resolution at least 0.1 mg, meaningful results from about 1 mg]: the resolution must be 0.1 mg
 * or finer and the practical lower limit at least ten times it.
 */
export function gravimetricMethodProblems(
  g: GravimetricFields,
  prefix = "details.",
): FieldProblem[] {
  const problems: FieldProblem[] = [];
  if (g.balanceResolutionMg > 0.1)
    problems.push({
      field: `${prefix}balanceResolutionMg`,
      message: "The balance must resolve 0.1 mg or finer for residue weighing.",
    });
  if (g.practicalLowerLimitMg < 10 * g.balanceResolutionMg)
    problems.push({
      field: `${prefix}practicalLowerLimitMg`,
      message: `The practical lower limit must be at least ten times the balance resolution (${10 * g.balanceResolutionMg} mg).`,
    });
  return problems;
}

const range = (key: string) => {
  const c = SIZE_CLASSES.find((x) => x.key === key)!;
  return c.maxUm === null ? `≥ ${c.minUm} µm` : `${c.minUm}–${c.maxUm} µm`;
};

/**
 * A run may cite an analysis method only if its lower size limit sees every class the run
 * counted: a count in a class below the limit contradicts the method [std, ISO 16232:2018 /
 * VDA 19.1:2015: a class is evaluated only where the analysis sees it whole].
 */
export function citedLowerLimitProblem(
  countsPerSample: { label: string; counts: Partial<Record<string, number>> }[],
  lowerSizeLimitUm: number,
  field: string,
): FieldProblem | null {
  for (const s of countsPerSample) {
    const below = countedBelowLimit(s.counts, lowerSizeLimitUm);
    if (below.length > 0)
      return {
        field,
        message: `${s.label} has particles in class ${below[0]} (${range(below[0])}), which this method's lower size limit of ${lowerSizeLimitUm} µm does not analyse whole. Cite a method that sees that class, or correct the counts.`,
      };
  }
  return null;
}

export const LAB_METHOD_STATUS_LABELS = {
  draft: "Draft",
  approved: "Approved",
  superseded: "Superseded",
} as const;
