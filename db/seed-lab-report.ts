import { and, desc, eq, like } from "drizzle-orm";
import { appendAudit } from "@/lib/audit";
import { computeRunOutcome } from "@/lib/evidence/outcome";
import { runContentHash } from "@/lib/evidence/run-hash";
import { labDetailsSchema } from "@/lib/schemas/lab-details";
import type { Tx } from "./client";
import {
  cleanlinessSpecs,
  partFamilies,
  recipes,
  recipeVersions,
  signatures,
  labMethods,
  testRunLabDetails,
  testRunMethods,
  testRuns,
  testSamples,
  users,
} from "./schema";

/**
 * One invented valve-body particle run recorded the way a cleanliness lab reports it: the
 * extraction and its parameters, filter, analysis system, component data and largest particles,
 * verified, so its test report prints every field a customer expects. Written like the other demo
 * runs (seed-evidence.ts): raw rows, the outcome computed from them, the signatures bound to the
 * content hash that now includes the lab details.
 */

const AT = "2026-02-10";
const PER_CLASS: Record<string, [number, number, number, number]> = {
  // class: [sample 1, 2, 3 totals, fibres in sample 1]
  B: [4300, 3900, 4450, 0],
  C: [1750, 1620, 1810, 0],
  D: [880, 830, 910, 0],
  E: [250, 232, 266, 2],
  F: [68, 61, 72, 1],
  G: [24, 21, 25, 1],
  H: [8, 7, 9, 1],
  I: [1, 0, 1, 0],
  J: [1, 0, 0, 1],
};

function sample(i: 0 | 1 | 2) {
  const counts: Record<string, number> = {};
  const metallic: Record<string, number> = {};
  const nonMetallic: Record<string, number> = {};
  const fibre: Record<string, number> = {};
  for (const [k, row] of Object.entries(PER_CLASS)) {
    const total = row[i];
    if (total === 0) continue;
    counts[k] = total;
    // Fibres as found on the first part's membrane; about a tenth metallic (reflective) up to class H, the rest non-metallic.
    const f = i === 0 ? Math.min(row[3], total) : k === "J" ? total : 0;
    const m = k === "I" ? 0 : Math.round((total - f) / 10);
    if (f) fibre[k] = f;
    if (m) metallic[k] = m;
    if (total - f - m) nonMetallic[k] = total - f - m;
  }
  return {
    components: 1,
    counts,
    split: { metallic, nonMetallic, fibre },
    largest:
      i === 0
        ? { metallicUm: 340, nonMetallicUm: 450, fibreUm: 760 }
        : i === 1
          ? { metallicUm: 350, nonMetallicUm: 330 }
          : { metallicUm: 370, nonMetallicUm: 480 },
  };
}

export async function seedLabReport(
  tx: Tx,
  methods: { extraction: string; analysis: string } | null = null,
) {
  const person = async (email: string) =>
    (
      await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, email))
    )[0];
  const technician = await person("technician@fennmoor.example");
  const engineer = await person("engineer@fennmoor.example");
  const [found] = await tx
    .select({ family: partFamilies, spec: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(eq(partFamilies.code, "PF-VB-210"));
  const [version] = await tx
    .select({ id: recipeVersions.id })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.version, 2)));
  if (!technician || !engineer || !found || !version) return;
  const { family, spec } = found;

  const [last] = await tx
    .select({ number: testRuns.number })
    .from(testRuns)
    .where(like(testRuns.number, "TR-%"))
    .orderBy(desc(testRuns.number))
    .limit(1);
  const number = `TR-${String(Number(last?.number.slice(3) ?? 0) + 1).padStart(4, "0")}`;

  // Parsed by the form's own schema, so the demo holds only what the screen would accept.
  const details = labDetailsSchema.parse({
    component: {
      drawingRevision: "F",
      lot: "L-2026-0207-3",
      wettedAreaCm2: 420,
      wettedAreaMethod: "cad_model",
    },
    extraction: {
      procedure: "pressure_rinsing",
      liquid: "Filtered neutral aqueous cleaner, 0.5 % in deionised water",
      volumeMl: 1500,
      pressureBar: 3,
      flowLPerMin: 1.2,
      durationS: 90,
      controlledSurface: "All wetted internal bores and the outer surface; sealing faces included",
      extractions: 3,
    },
    filter: { material: "PET mesh", poreSizeUm: 5 },
    analysis: { system: "light_microscope_automated", magnification: 50, lowerSizeLimitUm: 5 },
    largest: {
      metallic: { lengthUm: 370, widthUm: 120, sampleLabel: "VB210-260210-3" },
      nonMetallic: { lengthUm: 480, widthUm: 210, sampleLabel: "VB210-260210-3" },
      fibre: { lengthUm: 760, widthUm: 18, sampleLabel: "VB210-260210-1" },
    },
  });
  const runData = {
    extractionSeries: [1520, 270, 68],
    blank: { counts: { B: 150, C: 40, D: 12, E: 2 }, largestUm: 80 },
  };
  const samples = ([0, 1, 2] as const).map((i) => ({
    sampleLabel: `VB210-260210-${i + 1}`,
    basketPosition: ["top rear corner", "centre", "bottom front"][i],
    worstCase: i === 0,
    data: sample(i),
  }));
  const computed = computeRunOutcome({
    testType: "particle_cleanliness",
    family: { ...family, wettedAreaCm2: details.component.wettedAreaCm2 },
    spec,
    conductivityLimitUsPerCm: null,
    samples,
    runData,
    lowerSizeLimitUm: details.analysis.lowerSizeLimitUm,
    photoCount: 0,
  });
  const [run] = await tx
    .insert(testRuns)
    .values({
      number,
      partFamilyId: family.id,
      recipeVersionId: version.id,
      specId: spec.id,
      testType: "particle_cleanliness",
      status: "verified",
      outcome: computed.outcome,
      technicianId: technician.id,
      lab: "Larchfield cleanliness lab",
      performedOn: AT,
      runData,
      createdBy: engineer.id,
      createdAt: `${AT}T08:00:00.000Z`,
    })
    .returning();
  const rows = await tx
    .insert(testSamples)
    .values(samples.map((s, i) => ({ ...s, runId: run.id, createdAt: `${AT}T09:0${i}:00.000Z` })))
    .returning();
  await tx.insert(testRunLabDetails).values({
    runId: run.id,
    details,
    updatedBy: technician.id,
    updatedAt: `${AT}T14:00:00.000Z`,
  });
  // The approved method versions the lab used, cited with the lab details.
  const cited = methods
    ? await tx
        .insert(testRunMethods)
        .values([
          { runId: run.id, kind: "extraction" as const, methodId: methods.extraction },
          { runId: run.id, kind: "analysis" as const, methodId: methods.analysis },
        ])
        .returning()
    : [];
  const citedVersions = await Promise.all(
    cited.map(async (c) => {
      const [m] = await tx.select().from(labMethods).where(eq(labMethods.id, c.methodId));
      return { kind: c.kind, methodId: m.id, code: m.code, version: m.version };
    }),
  );
  const citedLabel = (kind: string) => {
    const m = citedVersions.find((c) => c.kind === kind);
    return m ? `${m.code} v${m.version}` : null;
  };
  // Each event on the lab day, by who did it: the run opened in the morning, the lab details
  // entered in the afternoon, then the two signatures.
  await appendAudit(
    tx,
    technician,
    {
      eventType: "test_run.created",
      recordType: "test_run",
      recordId: run.id,
      new: {
        number,
        partFamilyId: family.id,
        recipeVersionId: version.id,
        testType: "particle_cleanliness",
        technicianId: technician.id,
        lab: "Larchfield cleanliness lab",
        performedOn: AT,
      },
    },
    new Date(`${AT}T08:00:00.000Z`),
  );
  await appendAudit(
    tx,
    technician,
    {
      eventType: "test_run.lab_details_saved",
      recordType: "test_run",
      recordId: run.id,
      old: { details: null },
      new: { details },
    },
    new Date(`${AT}T14:00:00.000Z`),
  );
  if (citedVersions.length)
    await appendAudit(
      tx,
      technician,
      {
        eventType: "test_run.methods_cited",
        recordType: "test_run",
        recordId: run.id,
        old: { extraction: null, analysis: null, gravimetric: null },
        new: {
          extraction: citedLabel("extraction"),
          analysis: citedLabel("analysis"),
          gravimetric: null,
        },
      },
      new Date(`${AT}T14:00:00.000Z`),
    );
  const { hash } = runContentHash(
    run,
    [...rows].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id.localeCompare(b.id)),
    [],
    details,
    [],
    citedVersions,
  );
  for (const [signer, meaning, time] of [
    [technician, "performed", "15:30"],
    [engineer, "verified", "16:45"],
  ] as const) {
    const signedAt = `${AT}T${time}:00.000Z`;
    const [sig] = await tx
      .insert(signatures)
      .values({
        recordType: "test_run",
        recordId: run.id,
        userId: signer.id,
        printedName: signer.name,
        meaning,
        signedAt,
        contentHash: hash,
      })
      .returning();
    await appendAudit(
      tx,
      signer,
      {
        eventType: "signature.applied",
        recordType: "signature",
        recordId: sig.id,
        new: {
          on: `test_run:${run.id}`,
          meaning,
          printedName: signer.name,
          contentHash: hash,
          signedAt,
        },
      },
      new Date(signedAt),
    );
  }
}
