import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import {
  auditEvents,
  cleanlinessSpecs,
  emailOutbox,
  instruments,
  testRunInstruments,
  nonconformanceItems,
  nonconformances,
  partFamilies,
  recipeVersions,
  users,
} from "@/db/schema";
import { todayUtc } from "@/lib/format/date";
import { addDays, dueDateFrom } from "@/lib/instruments/calibration";
import { particleSampleSchema } from "@/lib/schemas/evidence";
import {
  calibrationSchema,
  citeInstrumentsSchema,
  instrumentEditSchema,
  instrumentSchema,
} from "@/lib/schemas/instrument";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { getRunRow, runContent } from "@/lib/server/evidence/run-content";
import { signRun } from "@/lib/server/evidence/sign-run";
import { citeInstruments } from "@/lib/server/instruments/cite-instruments";
import { createInstrument } from "@/lib/server/instruments/create-instrument";
import { instrumentQueueProvider, CALIBRATION_KIND } from "@/lib/server/instruments/queue-provider";
import { recordCalibration } from "@/lib/server/instruments/record-calibration";
import { retireInstrument } from "@/lib/server/instruments/retire-instrument";
import { sendInstrumentOverdueNotices } from "@/lib/server/instruments/send-overdue-notices";
import { updateInstrument } from "@/lib/server/instruments/update-instrument";
import { qualifyCombination } from "@/lib/server/plant/qualify-combination";
import type { SessionUser } from "@/lib/server/auth/sessions";
import { localStore, setStore } from "@/lib/storage";
import { checkSignatures } from "@/lib/server/audit/check-signatures";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const storeDir = mkdtempSync(join(tmpdir(), "washproof-instruments-"));
type Person = { id: string; name: string };
let tech: Person;
let engineer: Person;
let familyId: string;
let versionId: string;
const today = todayUtc();

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
  const [spec] = await t.db
    .insert(cleanlinessSpecs)
    .values({ code: "CS-IN", name: "Instrument spec", ccc: "A(B-D18/E8/F7/G-H6/I-N00)" })
    .returning();
  const [family] = await t.db
    .insert(partFamilies)
    .values({
      code: "PF-IN",
      name: "Instrument part",
      material: "Al",
      wettedAreaCm2: 37.35,
      specId: spec.id,
    })
    .returning();
  familyId = family.id;
  const [effective] = await t.db
    .select()
    .from(recipeVersions)
    .where(eq(recipeVersions.status, "effective"));
  versionId = effective.id;
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

const register = (fields: Record<string, string>) =>
  createInstrument(
    engineer,
    instrumentSchema.parse({
      kind: "balance",
      description: "Analytical balance",
      location: "Cleanliness lab",
      calibrationIntervalMonths: "12",
      ...fields,
    }),
  );

const calibrate = (instrumentId: string, fields: Record<string, string>) =>
  recordCalibration(
    tech,
    calibrationSchema.parse({
      instrumentId,
      performer: "external",
      performedBy: "Calibration lab",
      result: "pass",
      ...fields,
    }),
  );

async function openRun(performedOn: string) {
  const run = await createRun(engineer, {
    partFamilyId: familyId,
    recipeVersionId: versionId,
    testType: "particle_cleanliness",
    technicianId: tech.id,
    lab: "Lab",
    performedOn,
  });
  await addSample(tech, {
    runId: run.id,
    sample: particleSampleSchema.parse({
      sampleLabel: "P-1",
      components: "1",
      counts: { E: "1" },
      largest: {},
    }),
  });
  return run;
}

const signPerformed = async (runId: string) =>
  signRun({
    userId: tech.id,
    password: DEMO_PASSWORD,
    runId,
    meaning: "performed",
    contentHash: (await runContent(t.db, (await getRunRow(t.db, runId))!)).hash,
  });

const eventsOf = (recordId: string) =>
  t.db.select().from(auditEvents).where(eq(auditEvents.recordId, recordId));

describe("the demo's register", () => {
  it("has instruments with calibration history cited by signed runs whose signatures still hold", async () => {
    const rows = await t.db.select().from(instruments);
    const byAsset = new Map(rows.map((r) => [r.assetNumber, r]));
    expect([...byAsset.keys()]).toEqual(
      expect.arrayContaining(["BAL-01", "AN-01", "CM-01", "INK-01"]),
    );
    // The rinse meter falls due within the fortnight: due soon, still usable.
    expect(byAsset.get("CM-01")!.dueOn).toBe(addDays(today, 12));
    const cited = await t.db.select().from(testRunInstruments);
    expect(cited.length).toBeGreaterThanOrEqual(6);
    expect((await checkSignatures(t.db)).findings).toEqual([]);
  });
});

describe("the register", () => {
  it("audits a new instrument and refuses its asset number twice, beside the field", async () => {
    const row = await register({ assetNumber: "T-BAL-1" });
    const [created] = await eventsOf(row.id);
    expect(created.action).toBe("instrument.created");
    expect(JSON.parse(created.newValue!)).toMatchObject({
      assetNumber: "T-BAL-1",
      calibrationIntervalMonths: 12,
    });
    await expect(register({ assetNumber: "T-BAL-1" })).rejects.toMatchObject({
      field: "assetNumber",
    });
  });

  it("records the old and new value of only what an edit changed", async () => {
    const row = await register({ assetNumber: "T-BAL-2" });
    await updateInstrument(
      engineer,
      instrumentEditSchema.parse({
        instrumentId: row.id,
        assetNumber: "T-BAL-2",
        kind: "balance",
        description: "Analytical balance",
        location: "Goods-in lab",
        calibrationIntervalMonths: "12",
        status: "out_of_service",
        statusReason: "Sent for repair",
      }),
    );
    const updated = (await eventsOf(row.id)).find((e) => e.action === "instrument.updated")!;
    expect(JSON.parse(updated.oldValue!)).toEqual({
      location: "Cleanliness lab",
      status: "in_service",
      statusReason: null,
    });
    expect(JSON.parse(updated.newValue!)).toEqual({
      location: "Goods-in lab",
      status: "out_of_service",
      statusReason: "Sent for repair",
    });
  });

  it("refuses a negative interval and a due date before the calibration date, beside their fields", () => {
    const interval = instrumentSchema.safeParse({
      assetNumber: "X",
      kind: "balance",
      description: "d",
      location: "l",
      calibrationIntervalMonths: "-6",
    });
    expect(interval.error?.issues[0].path).toEqual(["calibrationIntervalMonths"]);
    const due = calibrationSchema.safeParse({
      instrumentId: crypto.randomUUID(),
      calibratedOn: "2026-11-02",
      dueOn: "2026-10-01",
      performer: "in_house",
      performedBy: "Lab",
      result: "pass",
    });
    expect(due.error?.issues.map((i) => i.path.join("."))).toEqual(["dueOn"]);
    // A test-ink set has an expiry date, not an interval.
    const ink = instrumentSchema.safeParse({
      assetNumber: "INK",
      kind: "test_ink_set",
      description: "d",
      location: "l",
    });
    expect(ink.error?.issues[0].path).toEqual(["expiresOn"]);
  });
});

describe("runs cite instruments", () => {
  it("refuses a retired or unknown instrument by name, and binds the cited list into the signed content", async () => {
    const good = await register({
      assetNumber: "T-TH-1",
      kind: "thermometer",
      description: "Probe",
    });
    await calibrate(good.id, { calibratedOn: today });
    const old = await register({
      assetNumber: "T-TH-2",
      kind: "thermometer",
      description: "Old probe",
    });
    await retireInstrument(engineer, { instrumentId: old.id, reason: "Cracked sheath" });
    const run = await openRun(today);
    const before = (await runContent(t.db, (await getRunRow(t.db, run.id))!)).hash;
    await expect(
      citeInstruments(tech, { runId: run.id, instrumentIds: [good.id, old.id] }),
    ).rejects.toMatchObject({
      field: "instrumentIds",
      message: expect.stringContaining("T-TH-2 (Old probe) is retired"),
    });
    await expect(
      citeInstruments(tech, { runId: run.id, instrumentIds: [crypto.randomUUID()] }),
    ).rejects.toMatchObject({ field: "instrumentIds" });
    expect(citeInstrumentsSchema.safeParse({ runId: run.id, instrumentIds: ["x"] }).success).toBe(
      false,
    );
    await citeInstruments(tech, { runId: run.id, instrumentIds: [good.id] });
    const after = await runContent(t.db, (await getRunRow(t.db, run.id))!);
    expect(after.hash).not.toBe(before);
    expect(after.content.instruments).toEqual(["T-TH-1"]);
    const cited = (await eventsOf(run.id)).find((e) => e.action === "test_run.instruments_cited")!;
    expect(JSON.parse(cited.newValue!)).toEqual({ instruments: ["T-TH-1"] });
  });

  it("refuses to sign performed while a cited instrument is overdue, naming it and since when; a calibration lets it sign", async () => {
    const bal = await register({ assetNumber: "T-BAL-3" });
    // Calibrated 400 days ago on a 12-month interval: overdue since the day after its due date.
    const calibratedOn = addDays(today, -400);
    await calibrate(bal.id, { calibratedOn });
    const due = dueDateFrom(calibratedOn, 12);
    const run = await openRun(today);
    await citeInstruments(tech, { runId: run.id, instrumentIds: [bal.id] });
    await expect(signPerformed(run.id)).rejects.toThrow(
      `Balance T-BAL-3 (Analytical balance) is past its calibration due date (${due}): overdue since ${addDays(due, 1)}.`,
    );
    await calibrate(bal.id, { calibratedOn: today });
    await expect(signPerformed(run.id)).resolves.toMatchObject({ status: "performed" });
  });
});

describe("a calibration found out of tolerance", () => {
  it("opens a lab nonconformance containing the runs that cited it since its last passing calibration", async () => {
    const bal = await register({ assetNumber: "T-BAL-4" });
    await calibrate(bal.id, { calibratedOn: addDays(today, -300) });
    await calibrate(bal.id, { calibratedOn: addDays(today, -100), result: "adjusted" });
    const early = await openRun(addDays(today, -200));
    const late = await openRun(addDays(today, -50));
    await citeInstruments(tech, { runId: early.id, instrumentIds: [bal.id] });
    await citeInstruments(tech, { runId: late.id, instrumentIds: [bal.id] });
    const { nonconformance, suspects } = await calibrate(bal.id, {
      calibratedOn: today,
      result: "out_of_tolerance",
      note: "Reads 0.4 mg high at 100 g",
    });
    expect(suspects.map((s) => s.id)).toEqual([late.id]);
    const [nc] = await t.db
      .select()
      .from(nonconformances)
      .where(eq(nonconformances.id, nonconformance!.id));
    expect(nc.sourceKind).toBe("calibration");
    expect(nc.title).toContain("T-BAL-4");
    const items = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, nc.id));
    expect(items.map((i) => i.itemId)).toEqual([late.id]);
    const calibrated = (await eventsOf(bal.id)).filter((e) => e.action === "instrument.calibrated");
    expect(JSON.parse(calibrated.at(-1)!.newValue!)).toMatchObject({
      result: "out_of_tolerance",
      nonconformance: nc.number,
      suspectRuns: [late.number],
    });
  });

  it("refuses a calibration dated after today, and one on a test-ink set", async () => {
    const bal = await register({ assetNumber: "T-BAL-5" });
    await expect(calibrate(bal.id, { calibratedOn: addDays(today, 2) })).rejects.toMatchObject({
      field: "calibratedOn",
    });
    const ink = await register({
      assetNumber: "T-INK-1",
      kind: "test_ink_set",
      calibrationIntervalMonths: "",
      expiresOn: addDays(today, 90),
    });
    await expect(calibrate(ink.id, { calibratedOn: today })).rejects.toMatchObject({
      field: "instrumentId",
    });
  });
});

describe("due and overdue", () => {
  it("lists due and overdue instruments in the queue of those who keep the register, counted", async () => {
    const overdue = await register({ assetNumber: "T-PG-1", kind: "pressure_gauge" });
    await calibrate(overdue.id, { calibratedOn: addDays(today, -40), dueOn: addDays(today, -3) });
    const asTech = { id: tech.id, roles: ["technician"] } as unknown as SessionUser;
    const asReviewer = { id: tech.id, roles: ["reviewer"] } as unknown as SessionUser;
    const { items, totals } = await instrumentQueueProvider(asTech, new Date());
    const item = items.find((i) => i.id === `calibration:${overdue.id}`)!;
    expect(item.detail).toContain(`Overdue since ${addDays(today, -2)}`);
    expect(totals![CALIBRATION_KIND]).toBeGreaterThanOrEqual(items.length);
    const paged = await instrumentQueueProvider(asTech, new Date(), () => ({
      offset: 0,
      limit: 1,
    }));
    expect(paged.items).toHaveLength(1);
    expect(paged.totals![CALIBRATION_KIND]).toBe(totals![CALIBRATION_KIND]);
    expect((await instrumentQueueProvider(asReviewer, new Date())).items).toEqual([]);
  });

  it("e-mails once per instrument and due date when it becomes overdue", async () => {
    const gauge = await register({ assetNumber: "T-PG-2", kind: "pressure_gauge" });
    await calibrate(gauge.id, { calibratedOn: addDays(today, -40), dueOn: addDays(today, -1) });
    await sendInstrumentOverdueNotices();
    const sent = await t.db
      .select()
      .from(emailOutbox)
      .where(eq(emailOutbox.subject, "[Washproof] Overdue: calibration of T-PG-2"));
    expect(sent.length).toBeGreaterThan(0);
    await sendInstrumentOverdueNotices();
    const again = await t.db
      .select()
      .from(emailOutbox)
      .where(eq(emailOutbox.subject, "[Washproof] Overdue: calibration of T-PG-2"));
    expect(again).toHaveLength(sent.length);
    const notices = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(
          eq(auditEvents.recordId, gauge.id),
          eq(auditEvents.action, "instrument.overdue_notice_sent"),
        ),
      );
    expect(notices).toHaveLength(1);
    // A retired instrument is no longer chased.
    await retireInstrument(engineer, { instrumentId: gauge.id, reason: "Replaced by a new gauge" });
    const [row] = await t.db.select().from(instruments).where(eq(instruments.id, gauge.id));
    expect(row.status).toBe("retired");
  });
});
