import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, deviations, emailOutbox, partFamilies, recipes, users } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { todayUtc } from "@/lib/format/date";
import { deviationSchema } from "@/lib/schemas/deviation";
import { createDeviation } from "@/lib/server/deviations/create-deviation";
import { judgeRecordedValue } from "@/lib/server/deviations/judge-value";
import { recordDeviationLot } from "@/lib/server/deviations/record-lot";
import { runDeviationJob } from "@/lib/server/deviations/run-deviation-job";
import { signDeviation } from "@/lib/server/deviations/sign-deviation";
import { loadDeviation } from "@/lib/server/deviations/state";
import { withdrawDeviation } from "@/lib/server/deviations/withdraw-deviation";
import { listDeviations } from "@/lib/server/deviations/queries";
import { deviationQueueProvider } from "@/lib/server/deviations/queue-provider";
import { describeFailure } from "@/lib/server/errors";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};
let ph = "";
let family = "";
const NOW = new Date("2026-12-02T10:00:00.000Z");

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "technician"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
  ph = (await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-PH")))[0].id;
  family = (await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-PH-400")))[0].id;
}, 120_000);
afterAll(() => t.cleanup());

/** The pump housing's injection pressure is validated 10–15 bar [db/seed-data.ts]. */
const form = (over: Record<string, unknown> = {}) =>
  deviationSchema.parse({
    recipeId: ph,
    title: "Injection at 16 bar while the fixture nozzles are re-drilled",
    justification: "The re-drilled nozzles arrive next week; until then 16 bar clears the bore.",
    riskLevel: "medium",
    risk: "Seal wear on the fixture: checked at every shift change.",
    endsOn: "2026-12-10",
    maxLots: "3",
    reminderDays: "3",
    partFamilyIds: [family],
    parameters: [{ key: "wash.injection_pressure", temporaryLow: "10", temporaryHigh: "16" }],
    ...over,
  });

async function refusal(promise: Promise<unknown>) {
  try {
    await promise;
  } catch (error) {
    return describeFailure(error);
  }
  throw new Error("expected a refusal");
}

describe("the demo's deviations", () => {
  it("holds one active deviation and one the job expired after its reminder", async () => {
    const rows = await listDeviations({ state: "all", recipe: "" }, new Date());
    expect(rows.map((r) => [r.recipe, r.state])).toEqual(
      expect.arrayContaining([
        ["R-AW3-VB", "active"],
        ["R-SC1-SF", "expired"],
      ]),
    );
    const expired = rows.find((r) => r.state === "expired")!;
    // The page says why it ended after the job stored the expiry, not only before.
    expect((await loadDeviation(t.db, expired.d.id)).expiry).toBe("end_date");
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.recordId, expired.d.id));
    expect(events.map((e) => e.action)).toEqual(
      expect.arrayContaining(["deviation.reminder_sent", "deviation.expired"]),
    );
  });
});

describe("judging a recorded value", () => {
  it("says a value beyond the validated range is permitted by the demo's active detergent deviation, and by nothing before it was approved", async () => {
    const [vb] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    const today = todayUtc();
    // Validated 2–4 %, temporary up to 4.5 % [db/seed-data.ts, db/seed-deviations.ts].
    const judge = (value: number, on = today) =>
      judgeRecordedValue(t.db, { recipeId: vb.id, key: "wash.concentration", value, on });
    expect(await judge(3.5)).toMatchObject({ judgement: "within_validated", deviation: null });
    const within = await judge(4.3);
    expect(within?.judgement).toBe("within_temporary");
    expect(within?.deviation?.number).toMatch(/^DV-\d{4}-\d{3}$/);
    expect(within?.deviation?.high).toBe(4.5);
    expect(await judge(4.8)).toMatchObject({ judgement: "outside", deviation: null });
    expect(await judge(4.3, "2026-01-15")).toMatchObject({ judgement: "outside", deviation: null });
  });
});

describe("drafting a deviation", () => {
  it("refuses a past end date, an inverted range and one inside the validated range, each beside its field, writing nothing", async () => {
    const before = (await t.db.select().from(deviations)).length;
    const failure = await refusal(
      createDeviation(
        people.engineer,
        form({
          endsOn: "2026-11-30",
          parameters: [
            { key: "wash.injection_pressure", temporaryLow: "16", temporaryHigh: "12" },
            { key: "rinse.not_in_this_recipe", temporaryLow: "1", temporaryHigh: "2" },
          ],
        }),
        NOW,
      ),
    );
    expect(failure.kind).toBe("invalid");
    expect(Object.keys(failure.fieldErrors ?? {}).sort()).toEqual([
      "endsOn",
      "parameters.0.temporaryHigh",
      "parameters.1.key",
    ]);
    const same = await refusal(
      createDeviation(
        people.engineer,
        form({
          parameters: [{ key: "wash.injection_pressure", temporaryLow: "10", temporaryHigh: "15" }],
        }),
        NOW,
      ),
    );
    expect(same.fieldErrors?.["parameters.0.temporaryLow"]?.[0]).toMatch(
      /inside the validated range/,
    );
    expect((await t.db.select().from(deviations)).length).toBe(before);
  });

  it("refuses no scope and no limit in the schema, each beside its field", () => {
    const parsed = deviationSchema.safeParse({
      ...form(),
      endsOn: "",
      maxLots: "",
      partFamilyIds: [],
      parameters: [],
    });
    expect(parsed.success).toBe(false);
    const paths = parsed.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["endsOn", "partFamilyIds", "parameters"]));
  });
});

describe("a deviation's life", () => {
  it("is signed by its author, approved by another person, reminded once and expires once", async () => {
    const { id, number } = await createDeviation(people.engineer, form(), NOW);
    expect(number).toMatch(/^DV-2026-\d{3}$/);
    let view = await loadDeviation(t.db, id, NOW);
    expect(view.state).toBe("draft");
    expect(view.parameters[0]).toMatchObject({
      validatedLow: 10,
      validatedHigh: 15,
      temporaryHigh: 16,
    });
    const sign = (who: string, meaning: "authored" | "approved", hash = view.contentHash) =>
      signDeviation(
        people[who],
        { deviationId: id, meaning, password: DEMO_PASSWORD, contentHash: hash },
        NOW,
      );

    expect((await refusal(sign("approver", "approved"))).message).toMatch(/author signs/);
    await sign("engineer", "authored");
    expect((await refusal(sign("engineer", "approved"))).message).toMatch(/Segregation of duties/);
    expect((await refusal(sign("approver", "approved", "0".repeat(64)))).message).toMatch(
      /changed since you opened it/,
    );
    await sign("approver", "approved");
    view = await loadDeviation(t.db, id, NOW);
    expect(view.state).toBe("active");

    // Reminded from three days before its last day (2026-12-10), once.
    const mails = async () =>
      (await t.db.select().from(emailOutbox)).filter((m) => m.subject.includes(number)).length;
    const approvalMails = await mails();
    await runDeviationJob(new Date("2026-12-06T10:00:00.000Z"));
    expect(await mails()).toBe(approvalMails);
    await runDeviationJob(new Date("2026-12-07T10:00:00.000Z"));
    const reminded = await mails();
    expect(reminded).toBeGreaterThan(approvalMails);
    await runDeviationJob(new Date("2026-12-08T10:00:00.000Z"));
    expect(await mails()).toBe(reminded);

    // Active through its last day, expired the day after, on read and by the job, recorded once.
    expect((await loadDeviation(t.db, id, new Date("2026-12-10T22:00:00.000Z"))).state).toBe(
      "active",
    );
    expect((await loadDeviation(t.db, id, new Date("2026-12-11T01:00:00.000Z"))).state).toBe(
      "expired",
    );
    await runDeviationJob(new Date("2026-12-11T01:00:00.000Z"));
    await runDeviationJob(new Date("2026-12-11T02:00:00.000Z"));
    const expiries = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.recordId, id), eq(auditEvents.action, "deviation.expired")));
    expect(expiries).toHaveLength(1);
    expect((await loadDeviation(t.db, id, NOW)).deviation.status).toBe("expired");
  });

  it("waits in the author's queue to sign, in the approvers' to approve, and in the author's again near its end", async () => {
    const { id, number } = await createDeviation(people.engineer, form(), NOW);
    const session = (who: string, roles: ("engineer" | "approver")[]) => ({
      ...people[who],
      email: `${who}@fennmoor.example`,
      roles,
      mustChangePassword: false,
      sessionId: "s",
    });
    const kinds = async (who: string, roles: ("engineer" | "approver")[], now = NOW) =>
      (await deviationQueueProvider(session(who, roles), now)).items
        .filter((i) => i.title.startsWith(number))
        .map((i) => i.kind);
    expect(await kinds("engineer", ["engineer"])).toEqual(["Deviation to sign"]);
    expect(await kinds("approver", ["approver"])).toEqual([]);
    const { contentHash } = await loadDeviation(t.db, id, NOW);
    const input = { deviationId: id, password: DEMO_PASSWORD, contentHash };
    await signDeviation(people.engineer, { ...input, meaning: "authored" }, NOW);
    expect(await kinds("engineer", ["engineer"])).toEqual([]);
    expect(await kinds("approver", ["approver"])).toEqual(["Deviation approval"]);
    await signDeviation(people.approver, { ...input, meaning: "approved" }, NOW);
    expect(await kinds("approver", ["approver"])).toEqual([]);
    expect(await kinds("engineer", ["engineer"])).toEqual([]);
    expect(await kinds("engineer", ["engineer"], new Date("2026-12-08T08:00:00.000Z"))).toEqual([
      "Deviation ending",
    ]);
  });

  it("expires on the lot that uses up its limit, and refuses a lot after it", async () => {
    const { id } = await createDeviation(people.engineer, form({ endsOn: "", maxLots: "2" }), NOW);
    const { contentHash } = await loadDeviation(t.db, id, NOW);
    const input = { deviationId: id, password: DEMO_PASSWORD, contentHash };
    await signDeviation(people.engineer, { ...input, meaning: "authored" }, NOW);
    await signDeviation(people.approver, { ...input, meaning: "approved" }, NOW);
    await recordDeviationLot(people.technician, { deviationId: id, lot: "PH-L1" }, NOW);
    expect(
      (await refusal(recordDeviationLot(people.technician, { deviationId: id, lot: "PH-L1" }, NOW)))
        .message,
    ).toMatch(/already counted/);
    await recordDeviationLot(people.technician, { deviationId: id, lot: "PH-L2" }, NOW);
    const view = await loadDeviation(t.db, id, NOW);
    expect(view.deviation.status).toBe("expired");
    expect(view.expiry).toBe("lots_used");
    expect(
      (await refusal(recordDeviationLot(people.technician, { deviationId: id, lot: "PH-L3" }, NOW)))
        .message,
    ).toMatch(/has expired/);
  });

  it("is withdrawn with a reason, and then takes no approval", async () => {
    const { id } = await createDeviation(people.engineer, form(), NOW);
    await withdrawDeviation(
      people.engineer,
      { deviationId: id, reason: "Nozzles arrived early." },
      NOW,
    );
    const view = await loadDeviation(t.db, id, NOW);
    expect(view.state).toBe("withdrawn");
    expect(
      (
        await refusal(
          signDeviation(
            people.engineer,
            {
              deviationId: id,
              meaning: "authored",
              password: DEMO_PASSWORD,
              contentHash: view.contentHash,
            },
            NOW,
          ),
        )
      ).message,
    ).toMatch(/withdrawn cannot be signed/);
  });
});
