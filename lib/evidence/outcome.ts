import {
  BASIS_UNIT,
  cleanlinessCode,
  evaluateAgainstSpec,
  evaluateBlank,
  evaluateExtraction,
  gravimetricResidue,
  normalizeCount,
  parseCleanlinessSpec,
  type Basis,
  type ParticleCounts,
} from "@/lib/cleanliness";
import { evaluateWettingTension } from "@/lib/surface";
import { conductivityAt25C } from "@/lib/water";
import type { Outcome, TestType } from "@/db/enums";
import {
  CLASS_KEYS,
  type ConductivitySample,
  type GravimetricSample,
  type ObservationSample,
  type ParticleRunData,
  type ParticleSample,
  type WettingSample,
} from "@/lib/schemas/evidence";
import { formatNumber } from "@/lib/format/number";

/**
 * The outcome of a test run, computed from its stored raw data with the pure
 * computations in lib/cleanliness, lib/surface and lib/water; nothing here is
 * typed by a person. Every check keeps its working so the screen can show it.
 */

export interface SpecForOutcome {
  ccc: string;
  maxMetallicUm: number | null;
  maxNonMetallicUm: number | null;
  maxFibreUm: number | null;
  gravimetricLimitMg: number | null;
  gravimetricBasis: "per_component" | "per_1000_cm2" | null;
  minWettingTensionMNm: number | null;
}

export interface OutcomeInput {
  testType: TestType;
  family: { wettedAreaCm2: number; wettedVolumeCm3: number | null };
  spec: SpecForOutcome;
  /** The recipe version's final-rinse conductivity limit in µS/cm, when it sets one. */
  conductivityLimitUsPerCm: number | null;
  samples: { sampleLabel: string; worstCase: boolean; data: unknown }[];
  runData: unknown;
  /** Photos attached to the run (visual, UV and dryness need at least one). */
  photoCount: number;
}

/** pass/fail, or null when the check could not be made (it makes the run incomplete). */
export interface Check {
  title: string;
  pass: boolean | null;
  lines: string[];
}

export interface SampleOutcome {
  sampleLabel: string;
  worstCase: boolean;
  outcome: Outcome;
  /** The sample's cleanliness code (particle tests). */
  code?: string;
  lines: string[];
}

export interface RunOutcome {
  outcome: Outcome;
  /** The run's cleanliness code over all samples together (particle tests). */
  code: string | null;
  basisUnit: string | null;
  samples: SampleOutcome[];
  checks: Check[];
  /** Why the outcome is incomplete, in words. */
  missing: string[];
}

const fmt = (n: number, digits = 1) => formatNumber(n, digits);
const word = (pass: boolean) => (pass ? "pass" : "fail");

function combine(samples: SampleOutcome[], checks: Check[], missing: string[]): Outcome {
  if (samples.length === 0) return "incomplete";
  if (missing.length > 0 || checks.some((c) => c.pass === null || (c.pass === false && c.title.startsWith("Measurement")))) return "incomplete";
  if (samples.some((s) => s.outcome === "incomplete")) return "incomplete";
  if (samples.some((s) => s.outcome === "fail") || checks.some((c) => c.pass === false)) return "fail";
  return "pass";
}

/** Stored rows were validated by the entry schema when written; the computations check their inputs again. */
function parsedSamples<T>(input: OutcomeInput): { label: string; worstCase: boolean; data: T }[] {
  return input.samples.map((s) => ({ label: s.sampleLabel, worstCase: s.worstCase, data: s.data as T }));
}

function basisOf(kind: Basis["kind"], components: number, family: OutcomeInput["family"]): Basis | null {
  if (kind === "area") return { kind, totalAreaCm2: components * family.wettedAreaCm2 };
  if (kind === "volume") return family.wettedVolumeCm3 ? { kind, totalVolumeCm3: components * family.wettedVolumeCm3 } : null;
  return { kind, components };
}

function particle(input: OutcomeInput): RunOutcome {
  const missing: string[] = [];
  const checks: Check[] = [];
  const spec = parseCleanlinessSpec(input.spec.ccc);
  const unit = BASIS_UNIT[spec.basis];
  const samples = parsedSamples<ParticleSample>(input);
  const pooled: ParticleCounts = {};
  let pooledComponents = 0;
  const out: SampleOutcome[] = samples.map(({ label, worstCase, data }) => {
    const basis = basisOf(spec.basis, data.components, input.family);
    if (!basis) return { sampleLabel: label, worstCase, outcome: "incomplete", lines: ["The part family has no wetted volume, so a V() specification cannot be evaluated."] };
    for (const k of CLASS_KEYS) pooled[k] = (pooled[k] ?? 0) + (data.counts[k] ?? 0);
    pooledComponents += data.components;
    const evaluation = evaluateAgainstSpec(data.counts, basis, spec);
    const lines = [basisLine(basis), ...evaluation.rows.map((r) => r.reason)];
    let pass = evaluation.pass;
    const largest: [string, number | undefined, number | null][] = [
      ["metallic", data.largest.metallicUm, input.spec.maxMetallicUm],
      ["non-metallic", data.largest.nonMetallicUm, input.spec.maxNonMetallicUm],
      ["fibre", data.largest.fibreUm, input.spec.maxFibreUm],
    ];
    for (const [type, size, limit] of largest) {
      if (size === undefined || limit === null) continue;
      const ok = size <= limit;
      if (!ok) pass = false;
      lines.push(`Largest ${type} particle ${fmt(size)} µm, limit ${fmt(limit)} µm: ${word(ok)}`);
    }
    return { sampleLabel: label, worstCase, outcome: pass ? "pass" : "fail", code: cleanlinessCode(data.counts, basis), lines };
  });

  const runData = (input.runData ?? {}) as Partial<ParticleRunData>;
  const series = runData.extractionSeries ?? [];
  if (series.length > 0) {
    try {
      const ex = evaluateExtraction(series);
      const lines = ex.ratios.map((r, i) => `Extraction ${i + 1}: ${fmt(series[i], 0)} particles, decay value ${fmt(r * 100)} %`);
      lines.push(
        ex.complete
          ? `Decay value ≤ 10 % at extraction ${ex.step}: extraction qualified`
          : ex.status === "change-parameters"
            ? "Decay value still above 10 % after 6 extractions: change the extraction parameters and qualify again"
            : "Decay value still above 10 %: extract again",
      );
      checks.push({ title: "Measurement: extraction (declining test)", pass: ex.complete ? true : null, lines });
    } catch (error) {
      checks.push({ title: "Measurement: extraction (declining test)", pass: null, lines: [(error as Error).message] });
    }
  } else {
    checks.push({ title: "Measurement: extraction (declining test)", pass: true, lines: ["No declining test recorded with this run; the extraction procedure is taken as qualified elsewhere."] });
  }

  if (runData.blank) {
    // The blank is judged against the limits for one sample's quantity: the smallest sample, the strictest case.
    const smallest = samples.length ? Math.min(...samples.map((s) => s.data.components)) : 1;
    const basis = basisOf(spec.basis, smallest, input.family);
    if (basis) {
      const normalised = Object.fromEntries(Object.entries(runData.blank.counts).map(([k, v]) => [k, normalizeCount(v as number, basis)]));
      const limits = [input.spec.maxMetallicUm, input.spec.maxNonMetallicUm, input.spec.maxFibreUm].filter((v): v is number => v !== null);
      const blank = evaluateBlank(normalised, spec, {
        largestAllowedUm: limits.length ? Math.min(...limits) : undefined,
        largestBlankParticleUm: runData.blank.largestUm ?? undefined,
      });
      const lines = [`Blank ${unit} for ${basisLine(basis).toLowerCase()}`, ...blank.rows.map((r) => r.reason)];
      if (blank.largestParticle) lines.push(blank.largestParticle.reason);
      checks.push({ title: "Measurement: blank value", pass: blank.pass, lines });
    } else {
      checks.push({ title: "Measurement: blank value", pass: null, lines: ["No wetted volume for the part family."] });
    }
  } else {
    missing.push("No blank value recorded: enter the blank counts to qualify the measurement.");
  }

  let code: string | null = null;
  if (pooledComponents > 0) {
    const basis = basisOf(spec.basis, pooledComponents, input.family);
    if (basis) code = cleanlinessCode(pooled, basis);
  }
  return { outcome: combine(out, checks, missing), code, basisUnit: unit, samples: out, checks, missing };
}

function basisLine(basis: Basis): string {
  if (basis.kind === "area") return `Tested area ${fmt(basis.totalAreaCm2)} cm²`;
  if (basis.kind === "volume") return `Tested volume ${fmt(basis.totalVolumeCm3)} cm³`;
  return `${basis.components} component${basis.components === 1 ? "" : "s"}`;
}

function gravimetric(input: OutcomeInput): RunOutcome {
  const missing: string[] = [];
  const checks: Check[] = [];
  const limit = input.spec.gravimetricLimitMg;
  if (limit === null) missing.push("The specification sets no gravimetric limit.");
  const perArea = input.spec.gravimetricBasis === "per_1000_cm2";
  const samples = parsedSamples<GravimetricSample>(input).map(({ label, worstCase, data }): SampleOutcome => {
    const r = gravimetricResidue({
      filterBeforeMg: data.filterBeforeMg,
      filterAfterMg: data.filterAfterMg,
      blankMg: data.blankMg,
      components: data.components,
      totalAreaCm2: data.components * input.family.wettedAreaCm2,
    });
    const value = perArea ? r.per1000Cm2Mg! : r.perComponentMg;
    const unit = perArea ? "mg per 1000 cm²" : "mg per component";
    const lines = [`Residue ${fmt(data.filterAfterMg, 2)} − ${fmt(data.filterBeforeMg, 2)} = ${fmt(r.residueMg, 2)} mg over ${data.components} component(s) → ${fmt(value, 3)} ${unit}`, ...r.notes];
    if (r.blankOk === false) return { sampleLabel: label, worstCase, outcome: "incomplete", lines: [...lines, "Blank above 10 % of the residue: the measurement is not qualified"] };
    if (limit === null) return { sampleLabel: label, worstCase, outcome: "incomplete", lines };
    const ok = value <= limit;
    lines.push(`Limit ${fmt(limit, 3)} ${unit}: ${word(ok)}`);
    return { sampleLabel: label, worstCase, outcome: ok ? "pass" : "fail", lines };
  });
  return { outcome: combine(samples, checks, missing), code: null, basisUnit: null, samples, checks, missing };
}

function wetting(input: OutcomeInput): RunOutcome {
  const missing: string[] = [];
  const min = input.spec.minWettingTensionMNm;
  if (min === null) missing.push("The specification sets no minimum wetting tension.");
  const samples = parsedSamples<WettingSample>(input).map(({ label, worstCase, data }): SampleOutcome => {
    if (min === null) return { sampleLabel: label, worstCase, outcome: "incomplete", lines: [`Readings ${data.readingsMNm.join(", ")} mN/m`] };
    const r = evaluateWettingTension(data.readingsMNm, min);
    return { sampleLabel: label, worstCase, outcome: r.pass ? "pass" : "fail", lines: [`Readings ${data.readingsMNm.join(", ")} mN/m`, r.reason, ...r.warnings] };
  });
  return { outcome: combine(samples, [], missing), code: null, basisUnit: null, samples, checks: [], missing };
}

function conductivity(input: OutcomeInput): RunOutcome {
  const missing: string[] = [];
  const limit = input.conductivityLimitUsPerCm;
  if (limit === null) missing.push("The recipe version sets no rinse-water conductivity limit.");
  const samples = parsedSamples<ConductivitySample>(input).map(({ label, worstCase, data }): SampleOutcome => {
    const k25 = conductivityAt25C(data.measuredUsPerCm, data.temperatureC);
    const lines = [`${fmt(data.measuredUsPerCm)} µS/cm at ${fmt(data.temperatureC)} °C → ${fmt(k25)} µS/cm at 25 °C (linear, α = 2 %/°C)`];
    if (limit === null) return { sampleLabel: label, worstCase, outcome: "incomplete", lines };
    const ok = k25 <= limit;
    lines.push(`Limit ${fmt(limit)} µS/cm at 25 °C: ${word(ok)}`);
    return { sampleLabel: label, worstCase, outcome: ok ? "pass" : "fail", lines };
  });
  return { outcome: combine(samples, [], missing), code: null, basisUnit: null, samples, checks: [], missing };
}

const OBSERVED: Record<"visual" | "uv_inspection" | "dryness", [string, string]> = {
  visual: ["No stains or visible residue", "Stains or visible residue seen"],
  uv_inspection: ["No oil film fluorescing under UV", "Oil film seen under UV"],
  dryness: ["Dry", "Water found"],
};

function observation(input: OutcomeInput & { testType: "visual" | "uv_inspection" | "dryness" }): RunOutcome {
  const missing: string[] = [];
  const checks: Check[] = [];
  const [good, bad] = OBSERVED[input.testType];
  const samples = parsedSamples<ObservationSample>(input).map(({ label, worstCase, data }): SampleOutcome => ({
    sampleLabel: label,
    worstCase,
    outcome: data.acceptable ? "pass" : "fail",
    lines: [`${data.acceptable ? good : bad}${data.observation ? `: ${data.observation}` : ""}`],
  }));
  checks.push({
    title: "Photos",
    pass: input.photoCount > 0 ? true : null,
    lines: [input.photoCount > 0 ? `${input.photoCount} photo(s) attached` : "No photo attached yet: attach at least one photo of what was seen."],
  });
  return { outcome: combine(samples, checks, missing), code: null, basisUnit: null, samples, checks, missing };
}

export function computeRunOutcome(input: OutcomeInput): RunOutcome {
  let result: RunOutcome;
  try {
    switch (input.testType) {
      case "particle_cleanliness":
        result = particle(input);
        break;
      case "gravimetric":
        result = gravimetric(input);
        break;
      case "wetting_tension":
        result = wetting(input);
        break;
      case "rinse_conductivity":
        result = conductivity(input);
        break;
      default:
        result = observation(input as OutcomeInput & { testType: "visual" });
    }
  } catch (error) {
    // A computation that refuses its input makes the run incomplete, with its reason.
    return { outcome: "incomplete", code: null, basisUnit: null, samples: [], checks: [], missing: [(error as Error).message] };
  }
  if (result.samples.length === 0 && !result.missing.some((m) => m.startsWith("No sample"))) result.missing.unshift("No sample recorded yet.");
  return result;
}
