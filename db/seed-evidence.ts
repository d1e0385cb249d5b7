import { and, eq } from "drizzle-orm";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { asOf } from "@/lib/audit/seed-stamp";
import { computeRunOutcome } from "@/lib/evidence/outcome";
import { runContentHash } from "@/lib/evidence/run-hash";
import type { Tx } from "./client";
import { citeDemoInstruments } from "./seed-instruments";
import {
  bathRecords,
  cleanlinessSpecs,
  cleaningSystems,
  maintenanceIntervals,
  partFamilies,
  recipeParameters,
  recipes,
  recipeVersions,
  signatures,
  systemStages,
  testSamples,
  testRuns,
  users,
  type TestType,
} from "./schema";

/**
 * The invented test history of the demo: particle, gravimetric, wetting and
 * rinse-water runs for the three part families, a few of them failing, and a
 * wash-tank log with one out-of-control detergent reading. Only raw data is
 * written here; every outcome is computed from it with lib/ as in the app.
 */

type Sample = {
  sampleLabel: string;
  cycleNumber?: string;
  basketPosition?: string;
  worstCase?: boolean;
  data: Record<string, unknown>;
};
type DemoRun = {
  family: string;
  recipe: string;
  version: number;
  testType: TestType;
  performedOn: string;
  status: "open" | "performed" | "verified";
  runData?: Record<string, unknown>;
  /** Asset numbers of the instruments the run used (db/seed-instruments.ts). */
  instruments?: string[];
  samples: Sample[];
};

const particle = (
  label: string,
  counts: Record<string, number>,
  largest: Record<string, number>,
  extra: Partial<Sample> = {},
): Sample => ({
  sampleLabel: label,
  ...extra,
  data: { components: 1, counts, split: null, largest },
});

// Valve body VB-210: three parts per run, one from the worst-case basket corner.
function valveBodyRun(
  performedOn: string,
  version: number,
  seed: number,
  opts: {
    bigParticle?: boolean;
    manyIJ?: boolean;
    status?: DemoRun["status"];
    instruments?: string[];
  } = {},
): DemoRun {
  const v = (base: number, i: number) =>
    Math.max(0, Math.round(base * (0.8 + ((seed * 7 + i * 13) % 10) / 25)));
  return {
    family: "PF-VB-210",
    recipe: "R-AW3-VB",
    version,
    testType: "particle_cleanliness",
    performedOn,
    status: opts.status ?? "verified",
    instruments: opts.instruments,
    runData: {
      extractionSeries: [v(1480, 1), v(260, 2), v(70, 3)],
      blank: { counts: { B: v(120, 4), C: v(40, 5), D: v(10, 6), E: 2 }, largestUm: 80 },
    },
    samples: [1, 2, 3].map((n) =>
      particle(
        `VB210-${performedOn.replaceAll("-", "").slice(2)}-${n}`,
        {
          B: v(4200, n),
          C: v(1800, n + 1),
          D: v(900, n + 2),
          E: v(260, n + 3),
          F: v(70, n + 4),
          G: v(25, n + 5),
          H: v(9, n + 6),
          ...(opts.manyIJ && n === 1 ? { I: 4, J: 1 } : { I: n === 2 ? 1 : 0 }),
          ...(opts.bigParticle && n === 3 ? { K: 1 } : {}),
        },
        {
          metallicUm: opts.bigParticle && n === 3 ? 1120 : 300 + n * 20,
          nonMetallicUm: 480,
          fibreUm: 760,
        },
        {
          // One part from each of the morning's three cycles: independent samples (db/seed-cycles.ts records them).
          cycleNumber: `AW3-${performedOn.replaceAll("-", "").slice(2)}-T${n}`,
          basketPosition: n === 1 ? "top rear corner" : n === 2 ? "centre" : "bottom front",
          worstCase: n === 1,
        },
      ),
    ),
  };
}

const DEMO_RUNS: DemoRun[] = [
  valveBodyRun("2025-04-08", 1, 1),
  valveBodyRun("2025-05-13", 1, 2),
  valveBodyRun("2025-06-10", 1, 3, { manyIJ: true }),
  valveBodyRun("2025-07-08", 1, 4),
  valveBodyRun("2025-09-09", 2, 5),
  valveBodyRun("2025-10-14", 2, 6, { instruments: ["AN-01"] }),
  valveBodyRun("2025-11-11", 2, 7, { bigParticle: true, instruments: ["AN-01"] }),
  valveBodyRun("2025-12-09", 2, 8, { instruments: ["AN-01"] }),
  valveBodyRun("2026-01-13", 2, 9, { status: "performed", instruments: ["AN-01"] }),
  {
    family: "PF-VB-210",
    recipe: "R-AW3-VB",
    version: 2,
    testType: "rinse_conductivity",
    performedOn: "2025-12-09",
    status: "verified",
    instruments: ["CM-01"],
    samples: [
      {
        sampleLabel: "Final rinse, start of shift",
        data: { measuredUsPerCm: 6.8, temperatureC: 21 },
      },
      {
        sampleLabel: "Final rinse, end of shift",
        data: { measuredUsPerCm: 8.1, temperatureC: 23.5 },
      },
    ],
  },
  {
    family: "PF-PH-400",
    recipe: "R-AW3-PH",
    version: 1,
    testType: "gravimetric",
    performedOn: "2025-08-19",
    status: "verified",
    samples: [
      {
        sampleLabel: "PH400-0819-1",
        data: { components: 1, filterBeforeMg: 91.42, filterAfterMg: 94.63, blankMg: 0.12 },
      },
      {
        sampleLabel: "PH400-0819-2",
        worstCase: true,
        basketPosition: "fixture 4",
        data: { components: 1, filterBeforeMg: 90.87, filterAfterMg: 94.95, blankMg: 0.12 },
      },
    ],
  },
  {
    family: "PF-PH-400",
    recipe: "R-AW3-PH",
    version: 1,
    testType: "gravimetric",
    performedOn: "2025-11-18",
    status: "verified",
    instruments: ["BAL-01"],
    samples: [
      {
        sampleLabel: "PH400-1118-1",
        data: { components: 1, filterBeforeMg: 91.05, filterAfterMg: 95.32, blankMg: 0.15 },
      },
      {
        sampleLabel: "PH400-1118-2",
        worstCase: true,
        basketPosition: "fixture 4",
        data: { components: 1, filterBeforeMg: 90.66, filterAfterMg: 96.88, blankMg: 0.15 },
      },
    ],
  },
  {
    family: "PF-PH-400",
    recipe: "R-AW3-PH",
    version: 1,
    testType: "particle_cleanliness",
    performedOn: "2025-11-18",
    status: "verified",
    runData: {
      extractionSeries: [5200, 980, 310],
      blank: { counts: { C: 150, D: 60, E: 12 }, largestUm: 140 },
    },
    samples: [
      particle(
        "PH400-1118-1",
        { C: 21000, D: 9000, E: 3100, F: 600, G: 210, H: 70, I: 12, J: 1 },
        { metallicUm: 540, nonMetallicUm: 820, fibreUm: 1500 },
      ),
      particle(
        "PH400-1118-2",
        { C: 24000, D: 9800, E: 3500, F: 680, G: 240, H: 80, I: 15, J: 2 },
        { metallicUm: 580, nonMetallicUm: 900, fibreUm: 1700 },
        { worstCase: true, basketPosition: "fixture 4" },
      ),
    ],
  },
  {
    family: "PF-SF-12",
    recipe: "R-SC1-SF",
    version: 1,
    testType: "particle_cleanliness",
    performedOn: "2025-10-21",
    status: "verified",
    runData: {
      extractionSeries: [2100, 420, 95],
      blank: { counts: { C: 20, D: 8 }, largestUm: 60 },
    },
    samples: [
      particle(
        "SF12-1021-A",
        { C: 9100, D: 4200, E: 1300, F: 520, G: 140, H: 22, I: 3 },
        { metallicUm: 310, nonMetallicUm: 450, fibreUm: 700 },
        { basketPosition: "mesh basket centre" },
      ),
      particle(
        "SF12-1021-B",
        { C: 9800, D: 4600, E: 1500, F: 600, G: 160, H: 30, I: 4 },
        { metallicUm: 350, nonMetallicUm: 500, fibreUm: 820 },
        { basketPosition: "mesh basket edge", worstCase: true },
      ),
    ].map((s) => ({ ...s, data: { ...s.data, components: 10 } })),
  },
  {
    family: "PF-SF-12",
    recipe: "R-SC1-SF",
    version: 1,
    testType: "wetting_tension",
    performedOn: "2025-10-21",
    status: "verified",
    samples: [
      { sampleLabel: "SF12-1021-A", data: { readingsMNm: [38, 38, 40] } },
      { sampleLabel: "SF12-1021-B", worstCase: true, data: { readingsMNm: [38, 36, 38] } },
    ],
  },
  {
    family: "PF-SF-12",
    recipe: "R-SC1-SF",
    version: 1,
    testType: "wetting_tension",
    performedOn: "2026-01-20",
    status: "verified",
    samples: [
      { sampleLabel: "SF12-0120-A", data: { readingsMNm: [36, 38, 36] } },
      { sampleLabel: "SF12-0120-B", worstCase: true, data: { readingsMNm: [34, 36, 34] } },
    ],
  },
  {
    family: "PF-PH-400",
    recipe: "R-AW3-PH",
    version: 1,
    testType: "particle_cleanliness",
    performedOn: "2026-02-03",
    status: "open",
    samples: [],
  },
];

const DAY = 86_400_000;

/** Weekly wash-tank readings; the eleventh has the detergent overdosed (the out-of-control point). */
function tankReadings(now: Date) {
  const start = Math.floor(now.getTime() / DAY) * DAY - 16 * 7 * DAY;
  const wobble = [
    0.05, -0.06, 0.02, -0.03, 0.07, -0.04, 0.01, -0.07, 0.04, -0.02, 0, 0.03, -0.05, 0.06, -0.01,
    0.02,
  ];
  return wobble.map((w, i) => ({
    performedAt: new Date(start + i * 7 * DAY + 7 * 3_600_000).toISOString(),
    concentrationPct: i === 10 ? 3.8 : Math.round((3.0 + w) * 100) / 100,
    conductivityUsPerCm: Math.round(8200 + w * 4000),
    temperatureC: Math.round((60 + w * 10) * 10) / 10,
    counts: [2600 + Math.round(w * 5000), 610 + Math.round(w * 900), 9 + Math.round(w * 20)],
  }));
}

export async function seedEvidence(tx: Tx, now = new Date()) {
  const audit = (input: Parameters<typeof appendAudit>[2]) =>
    appendAudit(tx, SYSTEM_ACTOR, input, now);
  const userId = async (email: string) =>
    (
      await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, email))
    )[0];
  const technician = await userId("technician@fennmoor.example");
  const engineer = await userId("engineer@fennmoor.example");
  if (!technician || !engineer) return;

  let n = 0;
  for (const demo of DEMO_RUNS) {
    n += 1;
    const [{ family, spec }] = await tx
      .select({ family: partFamilies, spec: cleanlinessSpecs })
      .from(partFamilies)
      .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
      .where(eq(partFamilies.code, demo.family));
    const [{ version }] = await tx
      .select({ version: recipeVersions })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(and(eq(recipes.code, demo.recipe), eq(recipeVersions.version, demo.version)));
    const [limit] = await tx
      .select({ setpoint: recipeParameters.setpoint })
      .from(recipeParameters)
      .where(
        and(
          eq(recipeParameters.versionId, version.id),
          eq(recipeParameters.kind, "conductivity_limit"),
        ),
      );
    const computed = computeRunOutcome({
      testType: demo.testType,
      family,
      spec,
      conductivityLimitUsPerCm: limit?.setpoint ?? null,
      samples: demo.samples.map((s) => ({
        sampleLabel: s.sampleLabel,
        worstCase: s.worstCase ?? false,
        data: s.data,
      })),
      runData: demo.runData ?? null,
      photoCount: 0,
    });
    const createdAt = `${demo.performedOn}T08:00:00.000Z`;
    const [run] = await tx
      .insert(testRuns)
      .values({
        number: `TR-${String(n).padStart(4, "0")}`,
        partFamilyId: family.id,
        recipeVersionId: version.id,
        specId: spec.id,
        testType: demo.testType,
        status: demo.status,
        outcome: computed.outcome,
        technicianId: technician.id,
        lab: "Larchfield cleanliness lab",
        performedOn: demo.performedOn,
        runData: demo.runData ?? null,
        createdBy: engineer.id,
        createdAt,
      })
      .returning();
    const rows = demo.samples.length
      ? await tx
          .insert(testSamples)
          .values(
            demo.samples.map((s, i) => ({
              runId: run.id,
              sampleLabel: s.sampleLabel,
              cycleNumber: s.cycleNumber ?? null,
              basketPosition: s.basketPosition ?? null,
              worstCase: s.worstCase ?? false,
              data: s.data,
              createdAt: `${demo.performedOn}T09:0${i}:00.000Z`,
            })),
          )
          .returning()
      : [];
    await asOf(createdAt, technician, () =>
      audit({
        eventType: "test_run.created",
        recordType: "test_run",
        recordId: run.id,
        new: {
          number: run.number,
          partFamilyId: run.partFamilyId,
          recipeVersionId: run.recipeVersionId,
          testType: run.testType,
          technicianId: technician.id,
          lab: "Larchfield cleanliness lab",
          performedOn: demo.performedOn,
        },
      }),
    );
    const cited = await citeDemoInstruments(tx, run.id, demo.instruments ?? []);
    const { hash } = runContentHash(
      run,
      [...rows].sort((a, b) => a.createdAt.localeCompare(b.createdAt) || a.id.localeCompare(b.id)),
      [],
      null,
      cited,
    );
    const sign = async (
      signer: { id: string; name: string },
      meaning: "performed" | "verified",
      at: string,
    ) => {
      const [sig] = await tx
        .insert(signatures)
        .values({
          recordType: "test_run",
          recordId: run.id,
          userId: signer.id,
          printedName: signer.name,
          meaning,
          signedAt: at,
          contentHash: hash,
        })
        .returning();
      await asOf(at, null, () =>
        appendAudit(
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
              signedAt: at,
            },
          },
          now,
        ),
      );
    };
    if (demo.status !== "open")
      await sign(technician, "performed", `${demo.performedOn}T15:30:00.000Z`);
    if (demo.status === "verified")
      await sign(engineer, "verified", `${demo.performedOn}T16:45:00.000Z`);
  }

  const [tank] = await tx
    .select({ stage: systemStages })
    .from(systemStages)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
    .where(and(eq(cleaningSystems.code, "AW-3"), eq(systemStages.position, 1)));
  if (!tank) return;
  const readings = tankReadings(now);
  for (const [i, r] of readings.entries()) {
    const [row] = await tx
      .insert(bathRecords)
      .values({
        stageId: tank.stage.id,
        kind: i % 8 === 0 ? "bath_change" : "reading",
        performedAt: r.performedAt,
        concentrationPct: r.concentrationPct,
        conductivityUsPerCm: r.conductivityUsPerCm,
        temperatureC: r.temperatureC,
        countPerMl4: r.counts[0],
        countPerMl6: r.counts[1],
        countPerMl14: r.counts[2],
        notes: i === 10 ? "Dosing pump stuck open; concentration corrected the same shift" : null,
        recordedBy: technician.id,
        createdAt: r.performedAt,
      })
      .returning();
    const {
      kind,
      performedAt,
      concentrationPct,
      conductivityUsPerCm,
      temperatureC,
      countPerMl4,
      countPerMl6,
      countPerMl14,
      notes,
    } = row;
    await asOf(performedAt, technician, () =>
      audit({
        eventType: "bath_record.created",
        recordType: "bath_record",
        recordId: row.id,
        new: {
          tank: tank.stage.name,
          kind,
          concentrationPct,
          conductivityUsPerCm,
          temperatureC,
          countPerMl4,
          countPerMl6,
          countPerMl14,
          notes,
          performedAt,
        },
      }),
    );
  }
  // Filter changes every four weeks; the last one is now overdue, so it shows in My queue.
  for (const weeksAgo of [14, 10, 6]) {
    const at = new Date(
      Math.floor(now.getTime() / DAY) * DAY - weeksAgo * 7 * DAY + 10 * 3_600_000,
    ).toISOString();
    const [row] = await tx
      .insert(bathRecords)
      .values({
        stageId: tank.stage.id,
        kind: "filter_change",
        performedAt: at,
        filterDescription: "Bag filter 25 µm",
        recordedBy: technician.id,
        createdAt: at,
      })
      .returning();
    await asOf(at, technician, () =>
      audit({
        eventType: "bath_record.created",
        recordType: "bath_record",
        recordId: row.id,
        new: {
          tank: tank.stage.name,
          kind: "filter_change",
          filterDescription: row.filterDescription,
          performedAt: at,
        },
      }),
    );
  }
  const since = new Date(now.getTime() - 20 * 7 * DAY).toISOString();
  for (const [kind, intervalDays] of [
    ["bath_change", 56],
    ["filter_change", 28],
    ["reading", 7],
  ] as const) {
    const [row] = await tx
      .insert(maintenanceIntervals)
      .values({
        stageId: tank.stage.id,
        kind,
        intervalDays,
        warnDays: 2,
        createdBy: engineer.id,
        createdAt: since,
      })
      .returning();
    await asOf(since, engineer, () =>
      audit({
        eventType: "maintenance_interval.set",
        recordType: "maintenance_interval",
        recordId: row.id,
        new: { tank: tank.stage.name, kind, intervalDays, warnDays: 2 },
      }),
    );
  }
}
