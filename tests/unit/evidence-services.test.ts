import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { MAINTENANCE_KINDS } from "@/db/enums";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import {
  auditEvents,
  cleanlinessSpecs,
  emailOutbox,
  evidenceFiles,
  maintenanceIntervals,
  partFamilies,
  recipeVersions,
  testSamples,
  testRuns,
  users,
} from "@/db/schema";
import { parseSampleCsv } from "@/lib/evidence/csv-import";
import { blobKey, localStore, setStore } from "@/lib/storage";
import {
  maintenanceIntervalSchema,
  particleRunDataSchema,
  particleSampleSchema,
  removeSampleSchema,
} from "@/lib/schemas/evidence";
import { addSample } from "@/lib/server/evidence/add-sample";
import { removeSample } from "@/lib/server/evidence/remove-sample";
import { setMaintenanceInterval } from "@/lib/server/bath/set-maintenance-interval";
import { createRun } from "@/lib/server/evidence/create-run";
import { qualifyCombination } from "@/lib/server/plant/qualify-combination";
import { importCsvRows } from "@/lib/server/evidence/import-csv";
import { computeStoredOutcome } from "@/lib/server/evidence/refresh-outcome";
import { readEvidenceFile } from "@/lib/server/evidence/read-file";
import { reviseRun } from "@/lib/server/evidence/revise-run";
import { getRunRow, runContent } from "@/lib/server/evidence/run-content";
import { saveRunData } from "@/lib/server/evidence/save-run-data";
import { signRun } from "@/lib/server/evidence/sign-run";
import { storeEvidenceFile } from "@/lib/server/evidence/store-file";
import { detachEvidenceFile } from "@/lib/server/evidence/detach-file";
import { evidenceQueueProvider } from "@/lib/server/evidence/queue-provider";
import { bathQueueProvider } from "@/lib/server/bath/queue-provider";
import { sendMaintenanceReminders } from "@/lib/server/bath/send-maintenance-reminders";
import { getQueue } from "@/lib/server/queue/get-queue";
import { getTank, listTanks } from "@/lib/server/bath/queries";
import { bathControlChart } from "@/lib/evidence/bath-chart";
import { listRunsPage, particleRunVersions } from "@/lib/server/evidence/queries";
import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const storeDir = mkdtempSync(join(tmpdir(), "washproof-evidence-"));
type Person = { id: string; name: string };
let tech: Person;
let engineer: Person;
let familyId: string;
let versionId: string;
const PDF = new TextEncoder().encode("%PDF-1.4\n% lab report VB\n%%EOF\n");
const PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 1, 2, 3]);
const sessionUser = (p: Person, roles: ("technician" | "engineer")[]) =>
  ({ ...p, email: "", roles, mustChangePassword: false }) as never;

beforeAll(async () => {
  t = await createTestDatabase();
  setStore(localStore(storeDir));
  await seedDemo(t.db);
  const byEmail = async (email: string) =>
    (
      await t.db
        .select({ id: users.id, name: users.name })
        .from(users)
        .where(eq(users.email, email))
    )[0];
  tech = await byEmail("technician@fennmoor.example");
  engineer = await byEmail("engineer@fennmoor.example");
  // The worked example of ISO 16232's sample report: three parts, 112.05 cm² together.
  const [spec] = await t.db
    .insert(cleanlinessSpecs)
    .values({
      code: "CS-TEST",
      name: "Test spec",
      ccc: "A(B-D18/E8/F7/G-H6/I-N00)",
      maxMetallicUm: 400,
    })
    .returning();
  const [family] = await t.db
    .insert(partFamilies)
    .values({
      code: "PF-TEST",
      name: "Test part",
      material: "Al",
      wettedAreaCm2: 37.35,
      specId: spec.id,
    })
    .returning();
  familyId = family.id;
  versionId = (await t.db.select().from(recipeVersions).limit(1))[0].id;
  // Runs are opened only on a qualified combination.
  await qualifyCombination(engineer, {
    recipeVersionId: versionId,
    partFamilyId: familyId,
    basis: "Test qualification",
    qualifiedOn: "2026-01-05",
    intervalMonths: 12,
  });
});
afterAll(() => {
  t.cleanup();
  rmSync(storeDir, { recursive: true, force: true });
});

async function newParticleRun() {
  return createRun(engineer, {
    partFamilyId: familyId,
    recipeVersionId: versionId,
    testType: "particle_cleanliness",
    technicianId: tech.id,
    lab: "Lab",
    performedOn: "2026-03-02",
  });
}

describe("outcome computed from stored rows", () => {
  it("gives the run's CCC and the class-by-class working, and says what is missing", async () => {
    const run = await newParticleRun();
    const sample = particleSampleSchema.parse({
      sampleLabel: "P-1",
      components: "3",
      counts: { E: "14", F: "6", H: "1" },
      largest: { metallicUm: "350" },
    });
    await addSample(tech, { runId: run.id, sample });
    let outcome = await computeStoredOutcome(t.db, (await getRunRow(t.db, run.id))!);
    // [std] ISO 16232 sample report as in standards.md: E 124.94, F 53.55, H 8.92 per 1000 cm² → E7, F6, H4
    expect(outcome.code).toMatch(/^A\(.*E7\/F6\/G00\/H4/);
    expect(outcome.samples[0].lines).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^E: 124\.9 per 1000 cm² → level 7.*pass$/),
        "Largest metallic particle 350 µm, limit 400 µm: pass",
      ]),
    );
    expect(outcome.outcome).toBe("incomplete");
    expect(outcome.missing.join(" ")).toMatch(/No blank value/);
    await saveRunData(tech, {
      runId: run.id,
      data: particleRunDataSchema.parse({
        extractionSeries: "100, 30, 8",
        blankMeasured: "on",
        blankCounts: { B: "3" },
      }),
    });
    const stored = (await t.db.select().from(testRuns).where(eq(testRuns.id, run.id)))[0];
    outcome = await computeStoredOutcome(t.db, stored);
    // [derived] 8 / 138 = 5.8 % → complete at extraction 3
    expect(outcome.checks.find((c) => c.title.includes("extraction"))!.lines.at(-1)).toMatch(
      /at extraction 3: extraction qualified/,
    );
    expect(outcome.outcome).toBe("pass");
    expect(stored.outcome).toBe("pass");
  });

  it("fails a sample above its limit and an extraction that has not declined makes the run incomplete", async () => {
    const run = await newParticleRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "P-2",
        components: "1",
        counts: { E: "40" },
        largest: {},
      }),
    });
    await saveRunData(tech, {
      runId: run.id,
      data: particleRunDataSchema.parse({
        extractionSeries: "",
        blankMeasured: "on",
        blankCounts: {},
      }),
    });
    expect((await computeStoredOutcome(t.db, (await getRunRow(t.db, run.id))!)).outcome).toBe(
      "fail",
    );
    await saveRunData(tech, {
      runId: run.id,
      data: particleRunDataSchema.parse({
        extractionSeries: "100, 40, 20",
        blankMeasured: "on",
        blankCounts: {},
      }),
    });
    // [derived] 20 / 160 = 12.5 % → not complete
    expect((await computeStoredOutcome(t.db, (await getRunRow(t.db, run.id))!)).outcome).toBe(
      "incomplete",
    );
  });
});

describe("signing, locking and revisions", () => {
  it("performed by the technician, verified by another person, then locked; a correction makes a new revision", async () => {
    const run = await newParticleRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "S-1",
        components: "3",
        counts: { E: "14" },
        largest: {},
      }),
    });
    const { hash } = await runContent(t.db, (await getRunRow(t.db, run.id))!);
    await expect(
      signRun({
        userId: engineer.id,
        password: DEMO_PASSWORD,
        runId: run.id,
        meaning: "performed",
        contentHash: hash,
      }),
    ).rejects.toThrow(/Only the technician/);
    await expect(
      signRun({
        userId: tech.id,
        password: DEMO_PASSWORD,
        runId: run.id,
        meaning: "performed",
        contentHash: "0".repeat(64),
      }),
    ).rejects.toThrow(/changed after you opened it/);
    await signRun({
      userId: tech.id,
      password: DEMO_PASSWORD,
      runId: run.id,
      meaning: "performed",
      contentHash: hash,
    });
    await expect(
      addSample(tech, {
        runId: run.id,
        sample: particleSampleSchema.parse({
          sampleLabel: "S-2",
          components: "1",
          counts: {},
          largest: {},
        }),
      }),
    ).rejects.toThrow(/locked/);
    await expect(
      signRun({
        userId: tech.id,
        password: DEMO_PASSWORD,
        runId: run.id,
        meaning: "verified",
        contentHash: hash,
      }),
    ).rejects.toThrow(/another person/);
    await signRun({
      userId: engineer.id,
      password: DEMO_PASSWORD,
      runId: run.id,
      meaning: "verified",
      contentHash: hash,
    });
    expect((await getRunRow(t.db, run.id))!.status).toBe("verified");

    const next = await reviseRun(engineer, { runId: run.id, reason: "Lab corrected the E count" });
    expect(next).toMatchObject({
      number: run.number,
      revision: 2,
      status: "open",
      supersedesId: run.id,
      revisionReason: "Lab corrected the E count",
    });
    expect((await getRunRow(t.db, run.id))!.status).toBe("superseded");
    expect(
      await t.db.select().from(testSamples).where(eq(testSamples.runId, next.id)),
    ).toHaveLength(1);
    const trail = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, next.id));
    expect(trail.map((e) => e.action)).toContain("test_run.revised");
  });

  it("refuses verification by whoever entered the run's data, whatever roles they hold", async () => {
    const run = await newParticleRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "S-1",
        components: "3",
        counts: { E: "14" },
        largest: {},
      }),
    });
    await addSample(engineer, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "S-2",
        components: "3",
        counts: { E: "12" },
        largest: {},
      }),
    });
    const { hash } = await runContent(t.db, (await getRunRow(t.db, run.id))!);
    await signRun({
      userId: tech.id,
      password: DEMO_PASSWORD,
      runId: run.id,
      meaning: "performed",
      contentHash: hash,
    });
    await expect(
      signRun({
        userId: engineer.id,
        password: DEMO_PASSWORD,
        runId: run.id,
        meaning: "verified",
        contentHash: hash,
      }),
    ).rejects.toThrow(
      "Segregation of duties: you entered data of this run, so another person must verify it.",
    );
    expect((await getRunRow(t.db, run.id))!.status).toBe("performed");
  });
});

describe("evidence files", () => {
  it("stores bytes once however often uploaded, and refuses to serve a tampered file", async () => {
    const run = await newParticleRun();
    const other = await newParticleRun();
    const first = await storeEvidenceFile(tech, {
      runId: run.id,
      name: "Lab report.pdf",
      bytes: PDF,
      kind: "lab_report",
    });
    const second = await storeEvidenceFile(tech, {
      runId: other.id,
      name: "Lab report copy.pdf",
      bytes: PDF,
      kind: "lab_report",
    });
    expect(first.created).toBe(true);
    expect(second.created).toBe(false);
    expect(second.file.sha256).toBe(first.file.sha256);
    const ok = await readEvidenceFile(engineer, first.file.id);
    expect(ok.ok && Buffer.from(ok.bytes).equals(Buffer.from(PDF))).toBe(true);

    writeFileSync(join(storeDir, blobKey(first.file.sha256)), "%PDF-1.4 altered");
    const bad = await readEvidenceFile(engineer, first.file.id);
    expect(bad).toMatchObject({
      ok: false,
      status: 409,
      message: expect.stringMatching(/no longer match their SHA-256/),
    });
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.recordId, first.file.id));
    expect(events.map((e) => e.action)).toEqual([
      "evidence_file.uploaded",
      "evidence_file.downloaded",
      "evidence_file.integrity_failed",
    ]);
  });

  it("counts the same file once per run, whatever name it is uploaded under", async () => {
    const run = await newParticleRun();
    const bytes = new TextEncoder().encode("%PDF-1.4 duplicate check " + run.id);
    await storeEvidenceFile(tech, { runId: run.id, name: "Report.pdf", bytes, kind: "lab_report" });
    await expect(
      storeEvidenceFile(tech, { runId: run.id, name: "Report (1).pdf", bytes, kind: "lab_report" }),
    ).rejects.toThrow(/already attached to .* as "Report.pdf".*counts once/);
    expect(
      await t.db.select().from(evidenceFiles).where(eq(evidenceFiles.runId, run.id)),
    ).toHaveLength(1);
  });

  it("detaches a file with its reason: it leaves the run, the row and the stored bytes stay, the audit trail says why", async () => {
    const run = await newParticleRun();
    const bytes = new TextEncoder().encode("%PDF-1.4 wrong run " + run.id);
    const { file } = await storeEvidenceFile(tech, {
      runId: run.id,
      name: "Other line.pdf",
      bytes,
      kind: "lab_report",
    });
    await expect(
      detachEvidenceFile(tech, {
        runId: run.id,
        fileId: file.id,
        reason: "Uploaded to the wrong run",
      }),
    ).resolves.toBeDefined();
    const [row] = await t.db.select().from(evidenceFiles).where(eq(evidenceFiles.id, file.id));
    expect(row).toMatchObject({
      runId: null,
      detachedFromRunId: run.id,
      detachedBy: tech.id,
      detachReason: "Uploaded to the wrong run",
    });
    const ok = await readEvidenceFile(engineer, file.id);
    expect(ok.ok).toBe(true);
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, file.id), eq(auditEvents.action, "evidence_file.detached")),
      );
    expect(JSON.parse(event.oldValue!)).toMatchObject({ runId: run.id });
    expect(JSON.parse(event.newValue!)).toMatchObject({
      reason: "Uploaded to the wrong run",
      sha256: file.sha256,
    });
    // Detached, the same file may be attached again; a second detach of the old row finds nothing.
    await storeEvidenceFile(tech, {
      runId: run.id,
      name: "Other line.pdf",
      bytes,
      kind: "lab_report",
    });
    await expect(
      detachEvidenceFile(tech, { runId: run.id, fileId: file.id, reason: "again" }),
    ).rejects.toThrow(/not attached/);
  });

  it("stores nothing for a bad upload", async () => {
    const run = await newParticleRun();
    const before = await t.db.select().from(evidenceFiles);
    await expect(
      storeEvidenceFile(tech, {
        runId: run.id,
        name: "report.pdf",
        bytes: PNG,
        kind: "lab_report",
      }),
    ).rejects.toThrow(/contents are a PNG/);
    await expect(
      storeEvidenceFile(tech, {
        runId: run.id,
        name: "../../etc/passwd",
        bytes: PDF,
        kind: "lab_report",
      }),
    ).rejects.toThrow(/folder path/);
    await expect(
      storeEvidenceFile(tech, { runId: run.id, name: "photo.pdf", bytes: PDF, kind: "photo" }),
    ).rejects.toThrow(/PNG or JPEG/);
    expect(await t.db.select().from(evidenceFiles)).toHaveLength(before.length);
  });
});

describe("CSV import service", () => {
  it("saves all rows and the file in one transaction, or nothing", async () => {
    const run = await newParticleRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "C-2",
        components: "1",
        counts: {},
        largest: {},
      }),
    });
    const csv = "sample,components,E,F\nC-1,1,10,2\nC-2,1,11,3\n";
    const parsed = await parseSampleCsv(csv);
    const bytes = new TextEncoder().encode(csv);
    await expect(
      importCsvRows(tech, {
        runId: run.id,
        testType: "particle_cleanliness",
        rows: parsed.rows,
        fileName: "counts.csv",
        bytes,
      }),
    ).rejects.toThrow(/Already recorded in this run: C-2/);
    expect(await t.db.select().from(testSamples).where(eq(testSamples.runId, run.id))).toHaveLength(
      1,
    );
    const good = await parseSampleCsv("sample,components,E,F\nC-3,1,10,2\nC-4,1,11,3\n");
    await importCsvRows(tech, {
      runId: run.id,
      testType: "particle_cleanliness",
      rows: good.rows,
      fileName: "counts.csv",
      bytes,
    });
    expect(await t.db.select().from(testSamples).where(eq(testSamples.runId, run.id))).toHaveLength(
      3,
    );
    expect(
      await t.db
        .select()
        .from(evidenceFiles)
        .where(and(eq(evidenceFiles.runId, run.id), eq(evidenceFiles.kind, "csv"))),
    ).toHaveLength(1);
  });
});

describe("demo history, list and queue", () => {
  it("has verified runs with computed failures, filterable and sorted on the server", async () => {
    const fails = await listRunsPage(
      evidenceListQuerySchema.parse({ outcome: "fail", sort: "performedOn", dir: "asc" }),
    );
    expect(fails.total).toBeGreaterThanOrEqual(3);
    expect(fails.rows.every((r) => r.outcome === "fail")).toBe(true);
    const page = await listRunsPage(
      evidenceListQuerySchema.parse({ pageSize: "5", page: "2", sort: "number", dir: "asc" }),
    );
    expect(page.rows).toHaveLength(5);
    expect(page.rows[0].number <= page.rows[4].number).toBe(true);
  });

  it("filters by recipe, and by a version number of it, the same runs as by the version's id", async () => {
    const versions = await t.db
      .select({
        id: recipeVersions.id,
        recipeId: recipeVersions.recipeId,
        version: recipeVersions.version,
      })
      .from(recipeVersions);
    const all = { pageSize: "100", includeSuperseded: "true" };
    const ids = async (query: Record<string, string>) =>
      (await listRunsPage(evidenceListQuerySchema.parse({ ...all, ...query }))).rows
        .map((r) => r.id)
        .sort();
    const withRuns: typeof versions = [];
    for (const v of versions)
      if ((await ids({ recipeVersionId: v.id })).length > 0) withRuns.push(v);
    const recipe = withRuns.find((v) =>
      withRuns.some((w) => w.recipeId === v.recipeId && w.id !== v.id),
    );
    expect(recipe, "a recipe with runs on two of its versions").toBeDefined();
    const ofRecipe = withRuns.filter((v) => v.recipeId === recipe!.recipeId);
    const byRecipe = await ids({ recipeId: recipe!.recipeId });
    expect(byRecipe).toEqual(
      (await Promise.all(ofRecipe.map((v) => ids({ recipeVersionId: v.id })))).flat().sort(),
    );
    for (const v of ofRecipe)
      expect(await ids({ recipeId: v.recipeId, version: String(v.version) })).toEqual(
        await ids({ recipeVersionId: v.id }),
      );
    expect(await ids({ recipeId: recipe!.recipeId, version: "999" })).toEqual([]);
    expect(() =>
      evidenceListQuerySchema.parse({ recipeId: recipe!.recipeId, version: "0" }),
    ).toThrow("Versions are numbered from 1.");
  });

  it("offers a family's particle trend the versions its particle runs were washed with, superseded ones too", async () => {
    const runs = await t.db
      .select({
        familyId: testRuns.partFamilyId,
        versionId: testRuns.recipeVersionId,
        status: testRuns.status,
        type: testRuns.testType,
      })
      .from(testRuns);
    const particle = runs.filter(
      (r) => r.type === "particle_cleanliness" && r.status !== "superseded",
    );
    const families = [...new Set(particle.map((r) => r.familyId))];
    expect(families.length).toBeGreaterThan(0);
    for (const family of families) {
      const offered = (await particleRunVersions(family)).map((v) => v.id).sort();
      const expected = [
        ...new Set(particle.filter((r) => r.familyId === family).map((r) => r.versionId)),
      ].sort();
      expect(offered).toEqual(expected);
    }
    const versionStatuses = new Map(
      (await t.db.select().from(recipeVersions)).map((v) => [v.id, v.status]),
    );
    // Labels say each version's status, so a superseded one reads as such.
    for (const v of await particleRunVersions(families[0]))
      expect(v.label).toMatch(new RegExp(`\\(${versionStatuses.get(v.id)}\\)$`));
  });

  it("queues tests to perform and verify, and due bath maintenance, and mails each reminder once", async () => {
    const techItems = (await evidenceQueueProvider(sessionUser(tech, ["technician"]), new Date()))
      .items;
    expect(techItems.some((i) => i.kind === "Perform test")).toBe(true);
    const engItems = (await evidenceQueueProvider(sessionUser(engineer, ["engineer"]), new Date()))
      .items;
    expect(engItems.some((i) => i.kind === "Verify test")).toBe(true);
    const bath = (await bathQueueProvider(sessionUser(tech, ["technician"]), new Date())).items;
    expect(bath.map((b) => b.kind)).toContain("Filter change");
    expect((await getQueue(sessionUser(tech, ["technician"]))).items.some((i) => i.overdue)).toBe(
      true,
    );

    const first = await sendMaintenanceReminders();
    expect(first.queued).toBeGreaterThan(0);
    expect((await sendMaintenanceReminders()).queued).toBe(0);
    const mail = await t.db.select().from(emailOutbox);
    expect(
      mail.some(
        (m) => /Overdue: filter change/.test(m.subject) && /Isolate the machine/.test(m.text),
      ),
    ).toBe(true);
  });
});

describe("demo wash-tank log", () => {
  it("has exactly one out-of-control detergent reading, computed by the individuals chart", async () => {
    const [first] = await listTanks();
    const tank = (await getTank(first.stage.id))!;
    const records = tank.records.map((r) => ({
      performedAt: r.record.performedAt,
      values: r.record,
    }));
    const concentration = bathControlChart(records, "concentrationPct")!;
    expect(concentration.points.filter((p) => p.outOfControl)).toEqual([
      expect.objectContaining({ value: 3.8, outOfControl: "beyond the 3σ limits" }),
    ]);
    // The jump up to the overdose and back down both exceed the moving-range limit.
    expect(concentration.movingRangeSignals).toHaveLength(2);
    expect(bathControlChart(records, "temperatureC")!.points.filter((p) => p.outOfControl)).toEqual(
      [],
    );
    expect(
      bathControlChart(records, "conductivityUsPerCm")!.points.filter((p) => p.outOfControl),
    ).toEqual([]);
  });
});

describe("changes that need a reason", () => {
  it("removes a sample only with a reason, kept in the audit event with the removed values", async () => {
    const run = await newParticleRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "R-1",
        components: "1",
        counts: { E: "4" },
        largest: {},
      }),
    });
    const [sample] = await t.db.select().from(testSamples).where(eq(testSamples.runId, run.id));
    expect(removeSampleSchema.safeParse({ runId: run.id, sampleId: sample.id }).success).toBe(
      false,
    );
    expect(
      removeSampleSchema.safeParse({ runId: run.id, sampleId: sample.id, reason: "  " }).success,
    ).toBe(false);
    await expect(
      removeSample(tech, { runId: run.id, sampleId: sample.id, reason: " " }),
    ).rejects.toMatchObject({ field: "reason" });
    expect(await t.db.select().from(testSamples).where(eq(testSamples.runId, run.id))).toHaveLength(
      1,
    );
    await removeSample(
      tech,
      removeSampleSchema.parse({
        runId: run.id,
        sampleId: sample.id,
        reason: "Typed against the wrong part",
      }),
    );
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, run.id), eq(auditEvents.action, "test_run.sample_removed")),
      );
    expect(event.reason).toBe("Typed against the wrong part");
    expect(JSON.parse(event.oldValue!)).toMatchObject({ sampleLabel: "R-1" });
  });

  it("sets a tank's first maintenance interval without a reason, and changes it only with one", async () => {
    // A tank and kind the demo has no interval for, so the first value is a first value.
    const existing = await t.db.select().from(maintenanceIntervals);
    const free = (await listTanks())
      .flatMap((tk) => MAINTENANCE_KINDS.map((kind) => ({ stageId: tk.stage.id, kind })))
      .find((c) => !existing.some((e) => e.stageId === c.stageId && e.kind === c.kind))!;
    const set = (extra: Record<string, string>) =>
      setMaintenanceInterval(
        engineer,
        maintenanceIntervalSchema.parse({ ...free, intervalDays: "30", warnDays: "2", ...extra }),
      );
    const first = await set({});
    await expect(set({ intervalDays: "45" })).rejects.toMatchObject({ field: "reason" });
    const [unchanged] = await t.db
      .select()
      .from(maintenanceIntervals)
      .where(eq(maintenanceIntervals.id, first.id));
    expect(unchanged.intervalDays).toBe(30);
    await set({ intervalDays: "45", reason: "Bath lasts longer with the new skimmer" });
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, first.id), eq(auditEvents.action, "maintenance_interval.set")),
      );
    expect(events.map((e) => e.reason)).toEqual([null, "Bath lasts longer with the new skimmer"]);
  });
});

describe("a large CSV import does not hold the server", () => {
  it("lets other work run between batches of inserts, inside its one transaction", async () => {
    const run = await newParticleRun();
    const rows = (
      await parseSampleCsv(
        [
          "sample,components,E,F",
          ...Array.from({ length: 3000 }, (_, i) => `L-${i},1,${i % 40},${i % 9}`),
        ].join("\n"),
      )
    ).rows;
    let turns = 0;
    let running = true;
    const tick = () => {
      turns += 1;
      if (running) setImmediate(tick);
    };
    const bytes = new TextEncoder().encode("large.csv");
    // A store that answers at once, so the turns counted are those of the transaction, not of a file write.
    const memory = new Map<string, Uint8Array>();
    setStore({
      driver: "local",
      put: async (sha, b) => ({ created: !memory.has(sha) && !!memory.set(sha, b) }),
      get: async (sha) => memory.get(sha) ?? null,
      has: async (sha) => memory.has(sha),
    });
    setImmediate(tick);
    const before = turns;
    try {
      await importCsvRows(tech, {
        runId: run.id,
        testType: "particle_cleanliness",
        rows,
        fileName: "large.csv",
        bytes,
      });
    } finally {
      running = false;
      setStore(localStore(storeDir));
    }
    // 3,000 rows are six batches of 500; the loop turns between them.
    expect(turns - before).toBeGreaterThanOrEqual(5);
    expect(await t.db.select().from(testSamples).where(eq(testSamples.runId, run.id))).toHaveLength(
      3000,
    );
  }, 60_000);
});
