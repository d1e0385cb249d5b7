import {
  BASIS_UNIT,
  cleanlinessCode,
  evaluateAgainstSpec,
  evaluateBlank,
  evaluateExtraction,
  normalizeCount,
  parseCleanlinessSpec,
  type Basis,
  type ParticleCounts,
} from "@/lib/cleanliness";
import { CLASS_KEYS, type ParticleRunData, type ParticleSample } from "@/lib/schemas/evidence";
import {
  combineOutcome,
  fmt,
  parsedSamples,
  word,
  type Check,
  type OutcomeInput,
  type RunOutcome,
  type SampleOutcome,
} from "./common";

/** Inputs a particle test reads; the rest of OutcomeInput does not matter to it. */
export type ParticleOutcomeInput = Pick<OutcomeInput, "family" | "spec" | "samples" | "runData">;

function basisOf(
  kind: Basis["kind"],
  components: number,
  family: OutcomeInput["family"],
): Basis | null {
  if (kind === "area") return { kind, totalAreaCm2: components * family.wettedAreaCm2 };
  if (kind === "volume")
    return family.wettedVolumeCm3
      ? { kind, totalVolumeCm3: components * family.wettedVolumeCm3 }
      : null;
  return { kind, components };
}

function basisLine(basis: Basis): string {
  if (basis.kind === "area") return `Tested area ${fmt(basis.totalAreaCm2)} cm²`;
  if (basis.kind === "volume") return `Tested volume ${fmt(basis.totalVolumeCm3)} cm³`;
  return `${basis.components} component${basis.components === 1 ? "" : "s"}`;
}

const EXTRACTION = "Measurement: extraction (declining test)";
const BLANK = "Measurement: blank value";

/**
 * Particle cleanliness (ISO 16232 / VDA 19.1): each sample's counts against the cleanliness code of
 * the specification and its largest-particle limits; the declining test and the blank value qualify
 * the measurement. The run's code pools every sample.
 */
export function particleOutcome(input: ParticleOutcomeInput): RunOutcome {
  const missing: string[] = [];
  const checks: Check[] = [];
  const spec = parseCleanlinessSpec(input.spec.ccc);
  const unit = BASIS_UNIT[spec.basis];
  const samples = parsedSamples<ParticleSample>(input);
  const pooled: ParticleCounts = {};
  let pooledComponents = 0;
  const out: SampleOutcome[] = samples.map(({ label, worstCase, data }) => {
    const basis = basisOf(spec.basis, data.components, input.family);
    if (!basis)
      return {
        sampleLabel: label,
        worstCase,
        outcome: "incomplete",
        lines: [
          "The part family has no wetted volume, so a V() specification cannot be evaluated.",
        ],
      };
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
    return {
      sampleLabel: label,
      worstCase,
      outcome: pass ? "pass" : "fail",
      code: cleanlinessCode(data.counts, basis),
      lines,
    };
  });

  const runData = (input.runData ?? {}) as Partial<ParticleRunData>;
  const series = runData.extractionSeries ?? [];
  if (series.length > 0) {
    try {
      const ex = evaluateExtraction(series);
      const lines = ex.ratios.map(
        (r, i) =>
          `Extraction ${i + 1}: ${fmt(series[i], 0)} particles, decay value ${fmt(r * 100)} %`,
      );
      lines.push(
        ex.complete
          ? `Decay value ≤ 10 % at extraction ${ex.step}: extraction qualified`
          : ex.status === "change-parameters"
            ? "Decay value still above 10 % after 6 extractions: change the extraction parameters and qualify again"
            : "Decay value still above 10 %: extract again",
      );
      checks.push({
        kind: "measurement",
        title: EXTRACTION,
        pass: ex.complete ? true : null,
        lines,
      });
    } catch (error) {
      checks.push({
        kind: "measurement",
        title: EXTRACTION,
        pass: null,
        lines: [(error as Error).message],
      });
    }
  } else {
    checks.push({
      kind: "measurement",
      title: EXTRACTION,
      pass: true,
      recorded: false,
      lines: [
        "No declining test recorded with this run; the extraction procedure is taken as qualified elsewhere.",
      ],
    });
  }

  if (runData.blank) {
    // The blank is judged against the limits for one sample's quantity: the smallest sample, the strictest case.
    const smallest = samples.length ? Math.min(...samples.map((s) => s.data.components)) : 1;
    const basis = basisOf(spec.basis, smallest, input.family);
    if (basis) {
      const normalised = Object.fromEntries(
        Object.entries(runData.blank.counts).map(([k, v]) => [
          k,
          normalizeCount(v as number, basis),
        ]),
      );
      const limits = [
        input.spec.maxMetallicUm,
        input.spec.maxNonMetallicUm,
        input.spec.maxFibreUm,
      ].filter((v): v is number => v !== null);
      const blank = evaluateBlank(normalised, spec, {
        largestAllowedUm: limits.length ? Math.min(...limits) : undefined,
        largestBlankParticleUm: runData.blank.largestUm ?? undefined,
      });
      const lines = [
        `Blank ${unit} for ${basisLine(basis).toLowerCase()}`,
        ...blank.rows.map((r) => r.reason),
      ];
      if (blank.largestParticle) lines.push(blank.largestParticle.reason);
      checks.push({ kind: "measurement", title: BLANK, pass: blank.pass, lines });
    } else {
      checks.push({
        kind: "measurement",
        title: BLANK,
        pass: null,
        lines: ["No wetted volume for the part family."],
      });
    }
  } else {
    missing.push("No blank value recorded: enter the blank counts to qualify the measurement.");
  }

  let code: string | null = null;
  if (pooledComponents > 0) {
    const basis = basisOf(spec.basis, pooledComponents, input.family);
    if (basis) code = cleanlinessCode(pooled, basis);
  }
  return {
    outcome: combineOutcome(out, checks, missing),
    code,
    basisUnit: unit,
    samples: out,
    checks,
    missing,
  };
}
