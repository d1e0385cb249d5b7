import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, asc, eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import {
  auditEvents,
  changeRequests,
  cleanlinessSpecs,
  emailOutbox,
  nonconformanceActions,
  nonconformanceItems,
  nonconformances,
  partFamilies,
  recipeVersions,
  signatures,
  testRuns,
  users,
  washCycleLots,
  washCycles,
} from "@/db/schema";
import { formatDate } from "@/lib/format/date";
import { recordCycleFlags } from "@/lib/server/cycles/flag-cycles";
import { doc, p } from "@/lib/documents/rich-text";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import { particleRunDataSchema, particleSampleSchema } from "@/lib/schemas/evidence";
import { dispositionSchema, openNcSchema, rootCauseSchema } from "@/lib/schemas/nonconformance";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { getRunRow, runContent } from "@/lib/server/evidence/run-content";
import { saveRunData } from "@/lib/server/evidence/save-run-data";
import { signRun } from "@/lib/server/evidence/sign-run";
import { addAction } from "@/lib/server/nonconformances/add-action";
import { advanceNonconformance } from "@/lib/server/nonconformances/advance";
import { openChangeFromAction } from "@/lib/server/nonconformances/open-change-from-action";
import { openNonconformance } from "@/lib/server/nonconformances/open-nonconformance";
import { planEffectiveness } from "@/lib/server/nonconformances/plan-effectiveness";
import { nonconformancesOfChange } from "@/lib/server/nonconformances/queries";
import { nonconformanceQueueProvider } from "@/lib/server/nonconformances/queue-provider";
import { recordEffectiveness } from "@/lib/server/nonconformances/record-effectiveness";
import { saveRootCause } from "@/lib/server/nonconformances/save-root-cause";
import { sendNonconformanceReminders } from "@/lib/server/nonconformances/send-reminders";
import { setDisposition } from "@/lib/server/nonconformances/set-disposition";
import { setItemHold } from "@/lib/server/nonconformances/set-item-hold";
import { setPendingItemsHold } from "@/lib/server/nonconformances/set-pending-items-hold";
import { loadNc, ncHash } from "@/lib/server/nonconformances/shared";
import { signClosure } from "@/lib/server/nonconformances/sign-closure";
import { updateAction } from "@/lib/server/nonconformances/update-action";
import { qualifyCombination } from "@/lib/server/plant/qualify-combination";
import { loadAuditPack } from "@/lib/server/trace/audit-pack";
import { localStore, setStore } from "@/lib/storage";
import { checkSignatures } from "@/lib/server/audit/check-signatures";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const storeDir = mkdtempSync(join(tmpdir(), "washproof-nc-"));
type Person = { id: string; name: string };
let tech: Person;
let engineer: Person;
let approver: Person;
let familyId: string;
let versionId: string;

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
  approver = await byEmail("approver@fennmoor.example");
  const [spec] = await t.db
    .insert(cleanlinessSpecs)
    .values({
      code: "CS-NC",
      name: "NC spec",
      ccc: "A(B-D18/E8/F7/G-H6/I-N00)",
      maxMetallicUm: 400,
    })
    .returning();
  const [family] = await t.db
    .insert(partFamilies)
    .values({
      code: "PF-NC",
      name: "NC part",
      material: "Al",
      wettedAreaCm2: 37.35,
      specId: spec.id,
    })
    .returning();
  familyId = family.id;
  // A recipe with no change under way, so the corrective action opens a new change request.
  const effective = await t.db
    .select()
    .from(recipeVersions)
    .where(eq(recipeVersions.status, "effective"));
  const busy = new Set(
    (await t.db.select().from(changeRequests))
      .filter((c) => OPEN_STATUSES.includes(c.status))
      .map((c) => c.recipeId),
  );
  versionId = effective.find((v) => !busy.has(v.recipeId))!.id;
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

/** A particle run signed performed and verified; E 40 on one part fails CS-NC's E8 (as in evidence-services). */
async function verifiedRun(opts: { fail: boolean; performedOn: string }) {
  const run = await createRun(engineer, {
    partFamilyId: familyId,
    recipeVersionId: versionId,
    testType: "particle_cleanliness",
    technicianId: tech.id,
    lab: "Lab",
    performedOn: opts.performedOn,
  });
  await addSample(tech, {
    runId: run.id,
    sample: particleSampleSchema.parse({
      sampleLabel: "P-1",
      components: "1",
      counts: { E: opts.fail ? "40" : "1" },
      largest: {},
    }),
  });
  await saveRunData(tech, {
    runId: run.id,
    data: particleRunDataSchema.parse({
      extractionSeries: "100, 5, 2",
      blankMeasured: "on",
      blankCounts: {},
    }),
  });
  const sign = async (who: Person, meaning: "performed" | "verified") => {
    const { hash } = await runContent(t.db, (await getRunRow(t.db, run.id))!);
    return signRun({
      userId: who.id,
      password: DEMO_PASSWORD,
      runId: run.id,
      meaning,
      contentHash: hash,
    });
  };
  await sign(tech, "performed");
  return { run, signed: await sign(approver, "verified") };
}

describe("the demo's failed runs", () => {
  it("are each owned by a nonconformance: one closed with two signatures, the others open", async () => {
    const failed = await t.db
      .select()
      .from(testRuns)
      .where(and(eq(testRuns.status, "verified"), eq(testRuns.outcome, "fail")));
    expect(failed.length).toBeGreaterThanOrEqual(2);
    const ncs = await t.db.select().from(nonconformances).orderBy(asc(nonconformances.number));
    for (const run of failed) expect(ncs.map((n) => n.sourceId)).toContain(run.id);
    const closed = ncs.filter((n) => n.status === "closed");
    expect(closed).toHaveLength(1);
    expect(ncs.some((n) => n.status !== "closed" && n.status !== "cancelled")).toBe(true);
    const sigs = await t.db
      .select()
      .from(signatures)
      .where(
        and(eq(signatures.recordType, "nonconformance"), eq(signatures.recordId, closed[0].id)),
      );
    expect(sigs.map((s) => s.meaning).sort()).toEqual(["approved", "authored"]);
    expect(new Set(sigs.map((s) => s.userId)).size).toBe(2);
    // Signed on what the record still hashes to.
    const hash = await t.db.transaction(async (tx) => ncHash(tx, await loadNc(tx, closed[0].id)));
    expect(sigs.every((s) => s.contentHash === hash)).toBe(true);
    expect((await checkSignatures(t.db)).findings).toEqual([]);
    // Raised on the failed run's own date, numbered per year without gaps.
    for (const nc of ncs.filter((n) => n.sourceKind === "run")) {
      const run = failed.find((r) => r.id === nc.sourceId)!;
      expect(nc.detectedOn).toBe(run.performedOn);
    }
    const byYear = new Map<number, number[]>();
    for (const nc of ncs) byYear.set(nc.year, [...(byYear.get(nc.year) ?? []), nc.sequence]);
    for (const seqs of byYear.values())
      expect(seqs.sort((a, b) => a - b)).toEqual(seqs.map((_, i) => i + 1));
  });
});

describe("the demo's flagged wash cycle", () => {
  it("owns one nonconformance, raised on the cycle's date, whose containment lists cycles with their lots", async () => {
    const flagged = await t.db.select().from(washCycles).where(eq(washCycles.flagged, true));
    expect(flagged).toHaveLength(1);
    const cycle = flagged[0];
    const ncs = await t.db
      .select()
      .from(nonconformances)
      .where(and(eq(nonconformances.sourceKind, "cycle"), eq(nonconformances.sourceId, cycle.id)));
    expect(ncs).toHaveLength(1);
    const [nc] = ncs;
    expect(nc.detectedOn).toBe(formatDate(cycle.startedAt));
    expect(nc.sourceLabel).toMatch(new RegExp(`cycle ${cycle.cycleNumber}$`));
    expect(nc.description).toBe(cycle.flagReasons.join("; "));
    expect(nc.partFamilyId).toBe(cycle.partFamilyId);
    const [version] = await t.db
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.id, cycle.recipeVersionId));
    expect(nc.recipeId).toBe(version.recipeId);
    const items = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, nc.id));
    const own = items.find((i) => i.itemKind === "cycle" && i.itemId === cycle.id);
    const lots = await t.db.select().from(washCycleLots).where(eq(washCycleLots.cycleId, cycle.id));
    expect(own?.lots.toSorted()).toEqual(lots.map((l) => l.lotNumber).toSorted());
    // Every cycle listed ran the same part family on a version of the same recipe.
    const listed = await t.db
      .select({ family: washCycles.partFamilyId, recipeId: recipeVersions.recipeId })
      .from(washCycles)
      .innerJoin(recipeVersions, eq(recipeVersions.id, washCycles.recipeVersionId))
      .where(
        inArray(
          washCycles.id,
          items.filter((i) => i.itemKind === "cycle").map((i) => i.itemId),
        ),
      );
    expect(listed.every((c) => c.family === cycle.partFamilyId && c.recipeId === nc.recipeId)).toBe(
      true,
    );
  });

  it("holds one cycle by hand and releases every other undecided one at once, each audited", async () => {
    const [cycle] = await t.db.select().from(washCycles).where(eq(washCycles.flagged, true));
    const [nc] = await t.db
      .select()
      .from(nonconformances)
      .where(and(eq(nonconformances.sourceKind, "cycle"), eq(nonconformances.sourceId, cycle.id)));
    const itemsOf = () =>
      t.db
        .select()
        .from(nonconformanceItems)
        .where(eq(nonconformanceItems.nonconformanceId, nc.id));
    const before = await itemsOf();
    const own = before.find((i) => i.itemId === cycle.id)!;
    const undecided = before.filter((i) => i.hold === "pending" && i.id !== own.id);
    expect(undecided.length).toBeGreaterThan(1);
    await setItemHold(engineer, { nonconformanceId: nc.id, itemId: own.id, hold: "held" });
    const eventsBefore = await t.db
      .select({ seq: auditEvents.seq })
      .from(auditEvents)
      .where(eq(auditEvents.recordId, nc.id));
    const { count } = await setPendingItemsHold(engineer, {
      nonconformanceId: nc.id,
      hold: "released",
    });
    expect(count).toBe(undecided.length);
    const after = await itemsOf();
    expect(after.find((i) => i.id === own.id)?.hold).toBe("held");
    expect(after.filter((i) => i.hold === "pending")).toEqual([]);
    expect(after.filter((i) => i.hold === "released")).toHaveLength(undecided.length);
    const eventsAfter = await t.db
      .select({ seq: auditEvents.seq })
      .from(auditEvents)
      .where(eq(auditEvents.recordId, nc.id));
    expect(eventsAfter.length - eventsBefore.length).toBe(undecided.length);
    // Nothing is left to decide: a second call says so rather than writing nothing.
    await expect(
      setPendingItemsHold(engineer, { nonconformanceId: nc.id, hold: "held" }),
    ).rejects.toThrow(/No item is waiting/);
  });

  it("is not raised twice when its flags are recorded again", async () => {
    const [cycle] = await t.db.select().from(washCycles).where(eq(washCycles.flagged, true));
    const [version] = await t.db
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.id, cycle.recipeVersionId));
    const count = () =>
      t.db
        .select({ id: nonconformances.id })
        .from(nonconformances)
        .where(
          and(eq(nonconformances.sourceKind, "cycle"), eq(nonconformances.sourceId, cycle.id)),
        );
    await t.db.transaction((tx) =>
      recordCycleFlags(tx, tech, [
        {
          id: cycle.id,
          cycleNumber: cycle.cycleNumber,
          system: "AW-3",
          lots: [],
          reasons: cycle.flagReasons,
          startedAt: cycle.startedAt,
          recipeId: version.recipeId,
          partFamilyId: cycle.partFamilyId,
        },
      ]),
    );
    expect(await count()).toHaveLength(1);
  });
});

describe("a run verified as Fail", () => {
  let ncId: string;

  it("opens its nonconformance in the same step, with containment since the last passing test", async () => {
    const passed = await verifiedRun({ fail: false, performedOn: "2026-03-02" });
    expect(passed.signed.nonconformance).toBeNull();
    const before = await verifiedRun({ fail: true, performedOn: "2026-03-03" });
    expect(before.signed.outcome).toBe("fail");
    const nc = before.signed.nonconformance!;
    expect(nc.number).toMatch(/^NC-\d{4}-\d{3}$/);
    ncId = nc.id;
    const [row] = await t.db.select().from(nonconformances).where(eq(nonconformances.id, nc.id));
    expect(row).toMatchObject({ sourceKind: "run", sourceId: before.run.id, status: "open" });
    const items = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, nc.id));
    // The passing run of 2026-03-02 bounds it: only the failed run is suspect.
    expect(items.map((i) => i.itemId)).toEqual([before.run.id]);
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "nonconformance.raised"), eq(auditEvents.recordId, nc.id)));
    expect(event.actorId).toBe(approver.id);
  });

  it("refuses bad input with the field named, and closing before the work is done", async () => {
    await expect(
      addAction(engineer, {
        nonconformanceId: ncId,
        kind: "corrective",
        description: "Change the filter",
        ownerId: engineer.id,
        dueOn: "2020-01-01",
      }),
    ).rejects.toMatchObject({ field: "dueOn" });
    const [item] = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, ncId));
    // A disposition needs the item held first, and a concession its reference and letter.
    await expect(
      setDisposition(engineer, { nonconformanceId: ncId, itemId: item.id, disposition: "scrap" }),
    ).rejects.toThrow(/Hold/);
    await setItemHold(engineer, { nonconformanceId: ncId, itemId: item.id, hold: "held" });
    await expect(
      setDisposition(engineer, {
        nonconformanceId: ncId,
        itemId: item.id,
        disposition: "use_as_is",
        concessionReference: "CONC-1",
      }),
    ).rejects.toMatchObject({ field: "concessionFileId" });
    const parsed = dispositionSchema.safeParse({
      nonconformanceId: ncId,
      itemId: item.id,
      disposition: "use_as_is",
    });
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues.map((i) => i.path[0]).sort()).toEqual([
      "concessionFileId",
      "concessionReference",
    ]);
    await expect(
      advanceNonconformance(engineer, { nonconformanceId: ncId, to: "cause_found" }),
    ).rejects.toThrow(/cannot move/);
    await expect(
      advanceNonconformance(engineer, { nonconformanceId: ncId, to: "cancelled", reason: " " }),
    ).rejects.toMatchObject({ field: "reason" });
    expect(
      rootCauseSchema.safeParse({ nonconformanceId: ncId, method: "five_whys", content: "" }).error
        ?.issues[0].message,
    ).toBe("Describe the root cause.");
    expect(
      openNcSchema.safeParse({
        manualKind: "customer_complaint",
        reference: "CC-1",
        title: "Chips in the bore",
        description: "Customer found chips in the bore.",
        severity: "major",
        detectedOn: "2999-01-01",
      }).error?.issues[0].message,
    ).toMatch(/future/);
  });

  it("is worked to closure: cause, a corrective action that opens a linked change, effectiveness with evidence, two signers", async () => {
    const [item] = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, ncId));
    const recipeId = (
      await t.db.select().from(nonconformances).where(eq(nonconformances.id, ncId))
    )[0].recipeId!;
    await setDisposition(engineer, {
      nonconformanceId: ncId,
      itemId: item.id,
      disposition: "reclean",
      recleanRecipeId: recipeId,
    });
    await advanceNonconformance(engineer, { nonconformanceId: ncId, to: "contained" });
    await saveRootCause(engineer, {
      nonconformanceId: ncId,
      method: "cause_and_effect",
      content: doc(p("Filter overloaded.")),
    });
    await advanceNonconformance(engineer, { nonconformanceId: ncId, to: "cause_found" });
    const action = await addAction(engineer, {
      nonconformanceId: ncId,
      kind: "corrective",
      description: "Lower the filter interval",
      ownerId: engineer.id,
      dueOn: "2026-12-31",
    });
    const mail = await t.db.select().from(emailOutbox);
    expect(mail.some((m) => m.subject.includes("corrective action assigned"))).toBe(true);
    const cr = await openChangeFromAction(engineer, {
      nonconformanceId: ncId,
      actionId: action.id,
      kind: "maintenance_interval",
    });
    const [change] = await t.db.select().from(changeRequests).where(eq(changeRequests.id, cr.id));
    expect(change.recipeId).toBe(recipeId);
    expect((await nonconformancesOfChange(cr.id)).map((n) => n.id)).toEqual([ncId]);
    // The change's audit pack names the nonconformance and carries its events.
    const pack = await loadAuditPack(t.db, cr.id);
    expect(pack.nonconformances.map((n) => n.id)).toEqual([ncId]);
    expect(pack.events.some((e) => e.eventType === "nonconformance.change_opened")).toBe(true);
    await advanceNonconformance(engineer, { nonconformanceId: ncId, to: "actions_under_way" });
    await expect(
      advanceNonconformance(engineer, { nonconformanceId: ncId, to: "effectiveness_check" }),
    ).rejects.toThrow(/still open/);
    await expect(
      updateAction(engineer, {
        nonconformanceId: ncId,
        actionId: action.id,
        status: "done",
        evidenceLink: null,
      }),
    ).rejects.toMatchObject({ field: "evidenceLink" });
    await updateAction(engineer, {
      nonconformanceId: ncId,
      actionId: action.id,
      status: "done",
      evidenceLink: change.number,
    });
    await planEffectiveness(engineer, {
      nonconformanceId: ncId,
      criterion: "The next verified particle run passes.",
      dueOn: "2026-12-31",
    });
    await advanceNonconformance(engineer, { nonconformanceId: ncId, to: "effectiveness_check" });
    await expect(
      recordEffectiveness(engineer, {
        nonconformanceId: ncId,
        result: "confirmed",
        evidenceRunNumber: null,
        evidenceFileId: null,
        note: null,
      }),
    ).rejects.toMatchObject({ field: "evidenceRunNumber" });
    const failedAgain = await verifiedRun({ fail: true, performedOn: "2026-03-05" });
    await expect(
      recordEffectiveness(engineer, {
        nonconformanceId: ncId,
        result: "confirmed",
        evidenceRunNumber: failedAgain.run.number,
        evidenceFileId: null,
        note: null,
      }),
    ).rejects.toThrow(/did not pass/);
    const good = await verifiedRun({ fail: false, performedOn: "2026-03-06" });
    await recordEffectiveness(engineer, {
      nonconformanceId: ncId,
      result: "confirmed",
      evidenceRunNumber: good.run.number,
      evidenceFileId: null,
      note: null,
    });
    // The approver sees the closure waiting in My queue.
    const approverQueue = await nonconformanceQueueProvider(
      { ...approver, email: "", roles: ["approver"], mustChangePassword: false, sessionId: "s" },
      new Date(),
    );
    expect(approverQueue.items.map((i) => i.id)).toContain(`nc:${ncId}:closure`);
    const hash = await t.db.transaction(async (tx) => ncHash(tx, await loadNc(tx, ncId)));
    await expect(
      signClosure(approver, { nonconformanceId: ncId, meaning: "approved", contentHash: hash }),
    ).rejects.toThrow(/authored before approval/);
    await signClosure(engineer, { nonconformanceId: ncId, meaning: "authored", contentHash: hash });
    await expect(
      signClosure(engineer, { nonconformanceId: ncId, meaning: "approved", contentHash: hash }),
    ).rejects.toThrow(/Segregation of duties/);
    await signClosure(approver, { nonconformanceId: ncId, meaning: "approved", contentHash: hash });
    expect(
      (await t.db.select().from(nonconformances).where(eq(nonconformances.id, ncId)))[0].status,
    ).toBe("closed");
    await expect(
      addAction(engineer, {
        nonconformanceId: ncId,
        kind: "preventive",
        description: "Anything more",
        ownerId: engineer.id,
        dueOn: "2026-12-31",
      }),
    ).rejects.toMatchObject({ kind: "locked" });
  });
});

describe("by hand, in the queue and by e-mail", () => {
  it("a customer complaint opens without a source record; unowned NCs reach every engineer", async () => {
    const nc = await openNonconformance(tech, {
      manualKind: "customer_complaint",
      reference: "CC-2026-17",
      title: "Swarf found in the bore",
      description: "The customer found swarf in the bore of two parts.",
      severity: "critical",
      detectedOn: "2026-03-04",
      recipeId: null,
      partFamilyId: familyId,
    });
    const [row] = await t.db.select().from(nonconformances).where(eq(nonconformances.id, nc.id));
    expect(row).toMatchObject({
      sourceKind: "manual",
      manualKind: "customer_complaint",
      sourceLabel: "CC-2026-17",
    });
    const asUser = (p: Person, roles: string[]) =>
      ({ ...p, email: "", roles, mustChangePassword: false, sessionId: "s" }) as never;
    const { items } = await nonconformanceQueueProvider(asUser(engineer, ["engineer"]), new Date());
    expect(items.map((i) => i.id)).toContain(`nc:${nc.id}`);
    const techItems = await nonconformanceQueueProvider(asUser(tech, ["technician"]), new Date());
    expect(techItems.items.map((i) => i.id)).not.toContain(`nc:${nc.id}`);
  });

  it("reminds an action's owner once when it falls due and once when overdue", async () => {
    const [open] = await t.db
      .select()
      .from(nonconformances)
      .where(eq(nonconformances.status, "contained"))
      .limit(1);
    await saveRootCause(engineer, {
      nonconformanceId: open.id,
      method: "other",
      content: doc(p("Unknown yet.")),
    });
    await advanceNonconformance(engineer, { nonconformanceId: open.id, to: "cause_found" });
    const action = await addAction(engineer, {
      nonconformanceId: open.id,
      kind: "preventive",
      description: "Train the night shift",
      ownerId: tech.id,
      dueOn: "2030-06-10",
    });
    const count = async () =>
      (await t.db.select().from(emailOutbox)).filter((m) =>
        m.subject.includes(`preventive action of ${open.number}`),
      ).length;
    await sendNonconformanceReminders(new Date("2030-06-01T08:00:00Z"));
    expect(await count()).toBe(0);
    await sendNonconformanceReminders(new Date("2030-06-09T08:00:00Z"));
    await sendNonconformanceReminders(new Date("2030-06-09T09:00:00Z"));
    expect(await count()).toBe(1);
    await sendNonconformanceReminders(new Date("2030-06-11T08:00:00Z"));
    expect(await count()).toBe(2);
    const [stored] = await t.db
      .select()
      .from(nonconformanceActions)
      .where(eq(nonconformanceActions.id, action.id));
    expect(stored.status).toBe("open");
  });
});

describe("integrity", () => {
  it("finds a closed nonconformance changed after its closure was approved", async () => {
    const [closed] = await t.db
      .select()
      .from(nonconformances)
      .where(eq(nonconformances.status, "closed"))
      .limit(1);
    await t.db
      .update(nonconformances)
      .set({ description: "Rewritten after approval" })
      .where(eq(nonconformances.id, closed.id));
    const { findings } = await checkSignatures(t.db);
    expect(findings.map((f) => f.message)).toContainEqual(
      expect.stringContaining(
        `Nonconformance ${closed.number} was changed after its closure was approved`,
      ),
    );
  });
});
