import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  bathRecords,
  controlPlanVersions,
  emailOutbox,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  signatures,
  sites,
  testRuns,
  testSamples,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { createControlPlanSchema } from "@/lib/schemas/control-plan";
import { createControlPlan } from "@/lib/server/control-plans/create-control-plan";
import { listDueControlPlanTests } from "@/lib/server/control-plans/due-tests";
import { controlPlanQueueProvider } from "@/lib/server/control-plans/queue-provider";
import { reviseControlPlan } from "@/lib/server/control-plans/revise-control-plan";
import { saveSiteClock } from "@/lib/server/control-plans/save-site-clock";
import { sendControlPlanOverdueNotices } from "@/lib/server/control-plans/send-overdue-notices";
import { signControlPlanIn } from "@/lib/server/control-plans/sign-control-plan-in";
import { siteClocksOf } from "@/lib/server/control-plans/site-clock";
import { loadControlPlan } from "@/lib/server/control-plans/state";
import { describeFailure } from "@/lib/server/errors";
import type { SessionUser } from "@/lib/server/auth/sessions";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "reviewer", "approver", "technician"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
}, 120_000);
afterAll(() => t.cleanup());

async function refusal(promise: Promise<unknown>) {
  try {
    await promise;
  } catch (error) {
    return describeFailure(error);
  }
  throw new Error("expected a refusal");
}

/** A qualified combination of an effective recipe version, other than the demo plan's. */
async function pumpHousing() {
  const [row] = await t.db
    .select({ versionId: recipeVersions.id, familyId: partFamilies.id })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .where(and(eq(recipes.code, "R-AW3-PH"), eq(recipeVersions.status, "effective")));
  return row;
}

const line = (over: Record<string, string> = {}) => ({
  characteristic: "wetting_tension",
  method: "Test inks 30–44 mN/m on the sealing face",
  stageId: "",
  sampleSize: "3",
  minCycles: "3",
  frequency: "daily",
  everyN: "",
  reactionPlan: "Hold the day's lots and re-clean.",
  ...over,
});

const asUser = (role: string, roles: SessionUser["roles"]) =>
  ({ ...people[role], email: `${role}@fennmoor.example`, roles }) as unknown as SessionUser;

describe("the demo's control plan", () => {
  it("is approved by three people and leaves a routine test due for the technician", async () => {
    const due = await listDueControlPlanTests();
    expect(due.length).toBeGreaterThanOrEqual(4);
    expect(due.some((d) => d.state !== "ok")).toBe(true);
    const plan = await loadControlPlan(t.db, due[0].controlPlanId);
    expect(plan.effective?.signatures.map((s) => s.meaning)).toEqual([
      "authored",
      "reviewed",
      "approved",
    ]);
    expect(new Set(plan.effective?.signatures.map((s) => s.userId)).size).toBe(3);
    const { items } = await controlPlanQueueProvider(
      asUser("technician", ["technician"]),
      new Date(),
    );
    expect(items.filter((i) => i.kind === "Routine test").length).toBeGreaterThan(0);
    // A test on parts opens a run prefilled for the combination; a bath value opens the tank's log.
    const rinse = items.find((i) => i.title.startsWith("Final-rinse conductivity"));
    expect(rinse?.href).toMatch(
      /^\/evidence\/runs\/new\?recipeVersion=[0-9a-f-]{36}&partFamily=[0-9a-f-]{36}&testType=rinse_conductivity&samples=1$/,
    );
    const titration = items.find((i) => i.title.startsWith("Bath concentration"));
    expect(titration?.href).toMatch(/^\/evidence\/bath\/[0-9a-f-]{36}$/);
    // An auditor reads plans but is given no test to do.
    expect(
      (await controlPlanQueueProvider(asUser("engineer", ["auditor"]), new Date())).items,
    ).toEqual([]);
  });

  it("a reading on the tank satisfies the per-shift titration until the next shift", async () => {
    const [tank] = (await listDueControlPlanTests()).filter(
      (d) => d.characteristic === "bath_concentration",
    );
    const now = new Date();
    await t.db.insert(bathRecords).values({
      stageId: tank.stageId!,
      kind: "reading",
      performedAt: new Date(now.getTime() - 60_000).toISOString(),
      concentrationPct: 3.1,
      recordedBy: people.technician.id,
    });
    const [after] = (await listDueControlPlanTests({ now })).filter(
      (d) => d.lineId === tank.lineId,
    );
    expect(after.state).toBe("ok");
    expect(after.dueAt! > now.toISOString()).toBe(true);
  });
});

describe("independent samples", () => {
  it("a run counts for a line only when its parts came out of the line's number of distinct cycles", async () => {
    const [line] = (await listDueControlPlanTests()).filter(
      (d) => d.characteristic === "gravimetric_residue",
    );
    expect(line.minCycles).toBe(3);
    const before = line.lastDoneAt;
    const [run] = await t.db
      .insert(testRuns)
      .values({
        number: "TR-CP-CYCLES",
        partFamilyId: line.partFamilyId,
        recipeVersionId: line.recipeVersionId,
        testType: "gravimetric",
        status: "verified",
        outcome: "pass",
        createdBy: people.technician.id,
        createdAt: new Date(Date.now() - 60_000).toISOString(),
      })
      .returning();
    const sample = (label: string, cycleNumber: string) => ({
      runId: run.id,
      sampleLabel: label,
      cycleNumber,
      data: { residueMg: 0.4 },
    });
    // Three parts, all from one basket of one cycle: not three independent samples.
    await t.db
      .insert(testSamples)
      .values([sample("S1", "C-9001"), sample("S2", "C-9001"), sample("S3", "C-9002")]);
    const [still] = (await listDueControlPlanTests()).filter((d) => d.lineId === line.lineId);
    expect(still.lastDoneAt).toBe(before);
    // A part from a third cycle makes it count.
    await t.db.insert(testSamples).values(sample("S4", "C-9003"));
    const [after] = (await listDueControlPlanTests()).filter((d) => d.lineId === line.lineId);
    expect(after.lastDoneAt).toBe(run.createdAt);
    expect(after.state).toBe("ok");
  });
});

describe("drafting a control plan", () => {
  it("refuses a combination that is not qualified, beside the field", async () => {
    const [unqualified] = await t.db
      .select({ v: recipeVersions.id })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(eq(recipes.code, "R-SC1-SF"));
    const [vb] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-VB-210"));
    const r = await refusal(
      createControlPlan(
        people.engineer,
        createControlPlanSchema.parse({
          combination: `${unqualified.v}:${vb.id}`,
          lines: [line()],
        }),
      ),
    );
    expect(r.fieldErrors).toHaveProperty("combination");
    expect(r.status).toBe(422);
  });

  it("refuses a tank of another washer beside its line", async () => {
    const combo = await pumpHousing();
    const r = await refusal(
      createControlPlan(
        people.engineer,
        createControlPlanSchema.parse({
          combination: `${combo.versionId}:${combo.familyId}`,
          lines: [line({ characteristic: "ph", stageId: crypto.randomUUID(), minCycles: "" })],
        }),
      ),
    );
    expect(r.fieldErrors).toHaveProperty(["lines.0.stageId"]);
  });
});

describe("the lifecycle: authored, reviewed, approved; a new version supersedes", () => {
  let planId = "";
  let versionId = "";
  let hash = "";
  const sign = (
    who: string,
    meaning: "authored" | "reviewed" | "approved",
    contentHash = hash,
    id = versionId,
  ) =>
    t.db.transaction((tx) =>
      signControlPlanIn(tx, people[who], { versionId: id, meaning, contentHash }),
    );

  it("drafts version 1 and refuses a second plan on the same combination", async () => {
    const combo = await pumpHousing();
    const input = createControlPlanSchema.parse({
      combination: `${combo.versionId}:${combo.familyId}`,
      lines: [line()],
    });
    ({ planId, versionId } = await createControlPlan(people.engineer, input));
    hash = (await loadControlPlan(t.db, planId)).versions[0].contentHash;
    const again = await refusal(createControlPlan(people.engineer, input));
    expect(again.status).toBe(409);
    expect(again.fieldErrors).toHaveProperty("combination");
  });

  it("takes no review before its author signs, and no author's signature from another person", async () => {
    expect((await refusal(sign("reviewer", "reviewed"))).message).toMatch(
      /its author signs it first/,
    );
    expect((await refusal(sign("reviewer", "authored"))).status).toBe(403);
  });

  it("refuses a signature on content other than what is stored", async () => {
    expect((await refusal(sign("engineer", "authored", "0".repeat(64)))).message).toMatch(
      /changed since you opened it/,
    );
  });

  it("keeps author, reviewer and approver three people", async () => {
    await sign("engineer", "authored");
    expect((await refusal(sign("engineer", "reviewed"))).message).toMatch(/Segregation of duties/);
    await sign("reviewer", "reviewed");
    expect((await refusal(sign("reviewer", "approved"))).message).toMatch(/Segregation of duties/);
    const { status } = await sign("approver", "approved");
    expect(status).toBe("effective");
    const stored = await t.db.select().from(signatures).where(eq(signatures.recordId, versionId));
    expect(stored.every((s) => s.contentHash === hash)).toBe(true);
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, versionId));
    expect(events.map((e) => e.action)).toEqual([
      "control_plan.created",
      "control_plan.status_changed",
      "control_plan.status_changed",
      "control_plan.status_changed",
    ]);
  });

  it("a revision is a new draft; its approval supersedes version 1", async () => {
    const { versionId: v2 } = await reviseControlPlan(people.engineer, {
      planId,
      note: "Wetting tension per shift",
    });
    expect(
      (await refusal(reviseControlPlan(people.engineer, { planId, note: "Another one" }))).message,
    ).toMatch(/still open/);
    const view = await loadControlPlan(t.db, planId);
    const h2 = view.versions[0].contentHash;
    expect(h2).not.toBe(hash);
    await sign("engineer", "authored", h2, v2);
    await sign("reviewer", "reviewed", h2, v2);
    await sign("approver", "approved", h2, v2);
    const statuses = await t.db
      .select({ version: controlPlanVersions.version, status: controlPlanVersions.status })
      .from(controlPlanVersions)
      .where(eq(controlPlanVersions.planId, planId));
    expect(statuses.sort((a, b) => a.version - b.version)).toEqual([
      { version: 1, status: "superseded" },
      { version: 2, status: "effective" },
    ]);
    // Only the effective version schedules tests.
    const due = await listDueControlPlanTests({ controlPlanId: planId });
    expect(due.map((d) => d.versionId)).toEqual([v2]);
  });
});

describe("overdue e-mail", () => {
  it("goes out once per line and due date", async () => {
    const later = new Date(Date.now() + 30 * 86_400_000);
    const overdue = await listDueControlPlanTests({ now: later, states: ["overdue"] });
    expect(overdue.length).toBeGreaterThan(0);
    const before = (await t.db.select().from(emailOutbox)).length;
    expect(await sendControlPlanOverdueNotices(later)).toBe(overdue.length);
    const mails = (await t.db.select().from(emailOutbox)).slice(before);
    expect(mails.some((m) => m.to === "technician@fennmoor.example")).toBe(true);
    expect(mails[0].subject).toMatch(/Routine test overdue/);
    expect(await sendControlPlanOverdueNotices(later)).toBe(0);
  });
});

describe("site shifts and zone", () => {
  it("defaults until saved, then follows the saved zone", async () => {
    const [site] = await t.db.select().from(sites);
    expect((await siteClocksOf(t.db, [site.id])).get(site.id)?.timeZone).toBe("Europe/Berlin");
    await saveSiteClock(people.engineer, {
      siteId: site.id,
      timeZone: "America/Chicago",
      shiftStarts: ["07:00", "19:00"],
    });
    expect((await siteClocksOf(t.db, [site.id])).get(site.id)).toEqual({
      timeZone: "America/Chicago",
      shiftStarts: ["07:00", "19:00"],
    });
  });
});
