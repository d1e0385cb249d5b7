import "server-only";
import { getDb } from "@/db/client";
import type { Outcome, RUN_STATUSES, SignatureMeaning, TestType } from "@/db/enums";
import { BASIS_UNIT, parseCleanlinessSpec, type Basis } from "@/lib/cleanliness";
import { countRows, type CountRow } from "@/lib/lab-report/count-rows";
import type { ParticleRunData, ParticleSample } from "@/lib/schemas/evidence";
import { PARTICLE_TYPES, type LabDetails, type ParticleType } from "@/lib/schemas/lab-details";
import type { Letterhead } from "@/lib/pdf/letterhead";
import { sha256OfBytes } from "@/lib/server/evidence/store-file";
import { getRunDetail } from "@/lib/server/evidence/queries";
import { loadLetterhead } from "@/lib/server/plant/letterhead";
import { getStore } from "@/lib/storage";
import { getLabDetails } from "./lab-details";
import { getRunMethods } from "@/lib/server/evidence/run-methods";

/** Photos travel to the PDF worker inside the job; larger ones are named, not embedded. */
const PHOTO_EMBED_LIMIT = 2 * 1024 * 1024;

export interface ReportLargest {
  type: ParticleType;
  lengthUm: number;
  widthUm: number | null;
  sampleLabel: string | null;
  limitUm: number | null;
  photo: { name: string; sha256: string; dataUri: string | null } | null;
}

/** Everything a test report prints, as plain data: the PDF worker has no database. */
export interface TestReport {
  letterhead: Letterhead;
  run: {
    number: string;
    revision: number;
    status: (typeof RUN_STATUSES)[number];
    testType: TestType;
    outcome: Outcome;
    performedOn: string | null;
    lab: string | null;
    technician: string | null;
    revisionReason: string | null;
    contentHash: string;
  };
  component: {
    familyCode: string;
    name: string;
    partNumbers: string[];
    material: string;
    drawingNumber: string | null;
    drawingRevision: string | null;
    lot: string | null;
    components: number;
    wettedAreaCm2: number;
    wettedAreaMethod: string | null;
  };
  spec: {
    code: string;
    name: string;
    revision: string;
    customer: string | null;
    documentNumber: string | null;
    ccc: string;
    maxUm: Record<ParticleType, number | null>;
    gravimetricLimitMg: number | null;
    gravimetricBasis: string | null;
    minWettingTensionMNm: number | null;
  };
  lab: LabDetails | null;
  /** The lab method versions the run cites (name and version, as approved). */
  methods: { kind: "extraction" | "analysis" | "gravimetric"; label: string }[];
  /** Particle runs: the pooled counts per class with the basis they are normalised to. */
  particles: {
    basisUnit: string;
    basisLine: string;
    rows: CountRow[];
    code: string | null;
    split: Record<ParticleType, number> | null;
    extractionSeries: number[];
    blank: { counts: Record<string, number>; largestUm: number | null } | null;
  } | null;
  largest: ReportLargest[];
  evaluation: {
    outcome: Outcome;
    code: string | null;
    checks: { title: string; word: string; lines: string[] }[];
    samples: {
      label: string;
      worstCase: boolean;
      outcome: Outcome;
      code?: string;
      lines: string[];
    }[];
    missing: string[];
  };
  deviations: string[];
  signatures: {
    printedName: string;
    meaning: SignatureMeaning;
    signedAt: string;
    contentHash: string;
    validity: "valid" | "invalid";
  }[];
  /** A verified run whose signatures all bind to its content is a controlled report. */
  controlled: boolean;
}

async function photoOf(file: {
  originalName: string;
  sha256: string;
  mimeType: string;
  sizeBytes: number;
}) {
  let dataUri: string | null = null;
  if (
    (file.mimeType === "image/png" || file.mimeType === "image/jpeg") &&
    file.sizeBytes <= PHOTO_EMBED_LIMIT
  ) {
    const bytes = await getStore().get(file.sha256);
    // Bytes that no longer match their hash are named, never printed as if they were the evidence.
    if (bytes && sha256OfBytes(bytes) === file.sha256)
      dataUri = `data:${file.mimeType};base64,${Buffer.from(bytes).toString("base64")}`;
  }
  return { name: file.originalName, sha256: file.sha256, dataUri };
}

/** The test report of one run revision, read from the stored rows and computed as the run page computes it. */
export async function loadTestReport(runId: string): Promise<TestReport | null> {
  const detail = await getRunDetail(runId);
  if (!detail) return null;
  const db = getDb();
  const { run, family, spec, recipe, outcome, samples, files, signatures } = detail;
  const lab = await getLabDetails(db, run.id);
  const methods = (await getRunMethods(db, run.id)).map((m) => ({
    kind: m.kind,
    label: `${m.code} v${m.version} · ${m.name}`,
  }));
  const particle = run.testType === "particle_cleanliness";
  const sampleData = samples.map(
    (s) => s.data as Partial<ParticleSample> & { components?: number },
  );
  const components = sampleData.reduce((n, d) => n + (d.components ?? 1), 0);
  const wettedAreaCm2 = lab?.component.wettedAreaCm2 ?? family.wettedAreaCm2;
  const maxUm: Record<ParticleType, number | null> = {
    metallic: spec.maxMetallicUm,
    nonMetallic: spec.maxNonMetallicUm,
    fibre: spec.maxFibreUm,
  };

  let particles: TestReport["particles"] = null;
  const largest: ReportLargest[] = [];
  if (particle) {
    const pooled: Record<string, number> = {};
    let split: Record<ParticleType, number> | null = { metallic: 0, nonMetallic: 0, fibre: 0 };
    for (const d of sampleData) {
      for (const [k, v] of Object.entries(d.counts ?? {})) pooled[k] = (pooled[k] ?? 0) + (v ?? 0);
      if (!d.split) split = null;
      else if (split)
        for (const t of PARTICLE_TYPES)
          split[t] += Object.values(d.split[t] ?? {}).reduce((a, b) => a + (b ?? 0), 0);
    }
    const kind = parseCleanlinessSpec(spec.ccc).basis;
    const basis: Basis =
      kind === "area"
        ? { kind, totalAreaCm2: components * wettedAreaCm2 }
        : kind === "volume"
          ? { kind, totalVolumeCm3: components * (family.wettedVolumeCm3 ?? 0) }
          : { kind, components };
    const runData = (run.runData ?? null) as ParticleRunData | null;
    const usable = kind !== "volume" || (family.wettedVolumeCm3 ?? 0) > 0;
    particles = {
      basisUnit: BASIS_UNIT[kind],
      basisLine:
        kind === "area"
          ? `${components} components × ${wettedAreaCm2} cm² = ${components * wettedAreaCm2} cm² tested`
          : kind === "volume"
            ? `${components} components × ${family.wettedVolumeCm3 ?? "—"} cm³ tested`
            : `${components} components`,
      rows:
        usable && components > 0
          ? countRows(pooled, basis, lab?.analysis.lowerSizeLimitUm ?? null)
          : [],
      code: outcome.code,
      split: samples.length ? split : null,
      extractionSeries: runData?.extractionSeries ?? [],
      blank: runData?.blank ?? null,
    };
    for (const type of PARTICLE_TYPES) {
      const recorded = lab?.largest[type];
      if (recorded?.lengthUm != null) {
        const file = recorded.photoFileId
          ? files.find(({ file: f }) => f.id === recorded.photoFileId)?.file
          : undefined;
        largest.push({
          type,
          lengthUm: recorded.lengthUm,
          widthUm: recorded.widthUm,
          sampleLabel: recorded.sampleLabel,
          limitUm: maxUm[type],
          photo: file ? await photoOf(file) : null,
        });
        continue;
      }
      // Without lab details the samples' own largest lengths are reported, with no width or photo.
      const key = `${type}Um` as const;
      let best: { um: number; label: string } | null = null;
      for (const s of samples) {
        const um = (s.data as ParticleSample).largest?.[key];
        if (um !== undefined && (!best || um > best.um)) best = { um, label: s.sampleLabel };
      }
      if (best)
        largest.push({
          type,
          lengthUm: best.um,
          widthUm: null,
          sampleLabel: best.label,
          limitUm: maxUm[type],
          photo: null,
        });
    }
  }

  const flags = outcome.samples.flatMap((s) =>
    s.lines
      .filter((l) => l.startsWith("Flag:") || l.includes("not analysed"))
      .map((l) => `${s.sampleLabel}: ${l}`),
  );
  const deviations = [
    ...(run.revisionReason
      ? [`Revision ${run.revision} corrects the one before: ${run.revisionReason}`]
      : []),
    ...(particle && !lab
      ? ["The extraction, filter and analysis details were not recorded with this run."]
      : []),
    ...outcome.missing,
    ...flags,
  ];
  const checkWord = (c: (typeof outcome.checks)[number]) =>
    c.recorded === false
      ? "not recorded"
      : c.pass === null
        ? "incomplete"
        : c.pass
          ? "pass"
          : "fail";

  return {
    letterhead: await loadLetterhead(db, recipe.systemId),
    run: {
      number: run.number,
      revision: run.revision,
      status: run.status,
      testType: run.testType,
      outcome: outcome.outcome,
      performedOn: run.performedOn,
      lab: run.lab,
      technician: detail.technician,
      revisionReason: run.revisionReason,
      contentHash: detail.contentHash,
    },
    component: {
      familyCode: family.code,
      name: family.name,
      partNumbers: family.partNumbers,
      material: family.material,
      drawingNumber: family.drawingNumber,
      drawingRevision: lab?.component.drawingRevision ?? family.drawingRevision,
      lot: lab?.component.lot ?? null,
      components,
      wettedAreaCm2,
      wettedAreaMethod: lab?.component.wettedAreaMethod ?? family.wettedAreaMethod,
    },
    spec: {
      code: spec.code,
      name: spec.name,
      revision: spec.revision,
      customer: spec.customer,
      documentNumber: spec.documentNumber,
      ccc: spec.ccc,
      maxUm,
      gravimetricLimitMg: spec.gravimetricLimitMg,
      gravimetricBasis: spec.gravimetricBasis,
      minWettingTensionMNm: spec.minWettingTensionMNm,
    },
    lab,
    methods,
    particles,
    largest,
    evaluation: {
      outcome: outcome.outcome,
      code: outcome.code,
      checks: outcome.checks.map((c) => ({ title: c.title, word: checkWord(c), lines: c.lines })),
      samples: outcome.samples.map((s) => ({
        label: s.sampleLabel,
        worstCase: s.worstCase,
        outcome: s.outcome,
        code: s.code,
        lines: s.lines,
      })),
      missing: outcome.missing,
    },
    deviations,
    signatures: signatures.map((s) => ({
      printedName: s.printedName,
      meaning: s.meaning,
      signedAt: s.signedAt,
      contentHash: s.contentHash,
      validity: s.validity,
    })),
    controlled:
      run.status === "verified" &&
      signatures.length > 0 &&
      signatures.every((s) => s.validity === "valid"),
  };
}
