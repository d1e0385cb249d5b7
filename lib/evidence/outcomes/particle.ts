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
import { analysedClasses, largestAgainstCounts } from "@/lib/lab-report/analysed-classes";
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
export type ParticleOutcomeInput = Pick<OutcomeInput, "family" | "spec" | "samples" | "runData"> &
  Partial<Pick<OutcomeInput, "lowerSizeLimitUm">>;

/** The basis a sample's counts are normalised on, or null (a V() specification with no wetted volume). */
export function basisOf(
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
  const analysed =
    input.lowerSizeLimitUm === null || input.lowerSizeLimitUm === undefined
      ? null
      : analysedClasses(input.lowerSizeLimitUm);
  // The code lists only the classes analysed [std, ISO 16232:2018: the CCC names the classes evaluated].
  const codeOf = (counts: ParticleCounts, basis: Basis) =>
    analysed && analysed.length > 0
      ? cleanlinessCode(counts, basis, { classes: analysed })
      : cleanlinessCode(counts, basis);
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
    const lines = [basisLine(basis)];
    let pass = evaluation.pass;
    let notAnalysed = false;
    for (const row of evaluation.rows) {
      // A limited class below the lower size limit was not looked at: "not analysed", never a zero that passes.
      const unseen = analysed ? row.classes.filter((k) => !analysed.includes(k)) : [];
      if (unseen.length === 0) {
        lines.push(row.reason);
        continue;
      }
      notAnalysed = true;
      lines.push(
        `Class${unseen.length === 1 ? "" : "es"} ${unseen.join(", ")}: not analysed (below the lower size limit of ${fmt(input.lowerSizeLimitUm!)} µm), so the specification's limit on ${row.classes.join("-")} cannot be judged`,
      );
    }
    const largest: [
      string,
      number | undefined,
      number | null,
      Partial<Record<string, number>> | undefined,
    ][] = [
      ["metallic", data.largest.metallicUm, input.spec.maxMetallicUm, data.split?.metallic],
      [
        "non-metallic",
        data.largest.nonMetallicUm,
        input.spec.maxNonMetallicUm,
        data.split?.nonMetallic,
      ],
      ["fibre", data.largest.fibreUm, input.spec.maxFibreUm, data.split?.fibre],
    ];
    for (const [type, size, limit, typeCounts] of largest) {
      if (size === undefined) continue;
      if (limit !== null) {
        const ok = size <= limit;
        if (!ok) pass = false;
        lines.push(`Largest ${type} particle ${fmt(size)} µm, limit ${fmt(limit)} µm: ${word(ok)}`);
      }
      // With the split measured, each type's largest is checked against that type's counts.
      if (typeCounts) {
        const check = largestAgainstCounts(`Largest ${type} particle`, size, typeCounts);
        if (!check.consistent) lines.push(`Flag: ${check.reason}`);
      }
    }
    if (data.split) {
      const total = (c: Partial<Record<string, number>>) =>
        Object.values(c).reduce<number>((a, b) => a + (b ?? 0), 0);
      lines.push(
        `Particle types: metallic (reflective) ${total(data.split.metallic)}, non-metallic ${total(data.split.nonMetallic)}, fibres ${total(data.split.fibre)}`,
      );
    }
    const sizes = [
      data.largest.metallicUm,
      data.largest.nonMetallicUm,
      data.largest.fibreUm,
    ].filter((v): v is number => v !== undefined);
    if (sizes.length > 0) {
      const check = largestAgainstCounts("Largest particle", Math.max(...sizes), data.counts);
      if (!check.consistent) lines.push(`Flag: ${check.reason}`);
    }
    return {
      sampleLabel: label,
      worstCase,
      outcome: notAnalysed ? "incomplete" : pass ? "pass" : "fail",
      code: codeOf(data.counts, basis),
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
    if (basis) code = codeOf(pooled, basis);
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
