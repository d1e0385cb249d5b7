import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as bathReadingsRoute from "@/app/api/v1/bath-readings/route";
import * as openapiRoute from "@/app/api/v1/openapi.json/route";
import { seedDemo } from "@/db/seed";
import {
  auditEvents,
  bathRecords,
  cleaningSystems,
  nonconformances,
  recipes,
  recipeVersions,
  systemStages,
  users,
} from "@/db/schema";
import { maintenanceStatus } from "@/lib/evidence/maintenance";
import { bathLimitSchema, detergentSchema } from "@/lib/schemas/bath-plan";
import { localStore, setStore } from "@/lib/storage";
import { storeCheckPhoto } from "@/lib/server/bath/store-check-photo";
import { cycleInputSchema } from "@/lib/schemas/cycle";
import { bathRecordSchema } from "@/lib/schemas/evidence";
import { recordCycles } from "@/lib/server/cycles/record-cycles-now";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { bathAge } from "@/lib/server/bath/bath-age";
import {
  BATH_ACTION_KIND,
  BATH_REJECT_KIND,
  bathLimitsQueueProvider,
} from "@/lib/server/bath/limits-queue-provider";
import { latestGradedByTank } from "@/lib/server/bath/queries";
import { recordBathEntry } from "@/lib/server/bath/record-bath-entry";
import { saveDetergent } from "@/lib/server/bath/save-detergent";
import { setBathLimit } from "@/lib/server/bath/set-bath-limit";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const PNG = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 1, 2, 3]);
const PDF = new TextEncoder().encode("%PDF-1.4\n% lab report\n%%EOF\n");
type Person = { id: string; name: string };
let tech: Person;
let engineer: Person;
let stageId: string;
let effectiveVersionId: string;
let detergentId: string;
const techUser = () =>
  ({ ...tech, email: "", roles: ["technician"], mustChangePassword: false }) as never;

beforeAll(async () => {
  t = await createTestDatabase();
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
  // A tank of its own on the demo's three-tank washer, so the seeded plan does not interfere.
  const [system] = await t.db
    .select()
    .from(cleaningSystems)
    .where(eq(cleaningSystems.code, "AW-3"));
  const [stage] = await t.db
    .insert(systemStages)
    .values({
      systemId: system.id,
      position: 90,
      name: "Test tank",
      kind: "wash",
      capabilities: [],
      tankVolumeL: 500,
    })
    .returning();
  stageId = stage.id;
  const [v] = await t.db
    .select({ id: recipeVersions.id })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  effectiveVersionId = v.id;
  detergentId = (
    await saveDetergent(
      engineer,
      detergentSchema.parse({ name: "Test cleaner T-1", factorPctPerMl: "0.5" }),
    )
  ).id;
}, 120_000);
afterAll(() => t.cleanup());

const limit = (over: Record<string, unknown>) =>
  bathLimitSchema.parse({ stageId, recipeVersionId: effectiveVersionId, ...over });
const reading = (over: Record<string, unknown>) =>
  bathRecordSchema.parse({ stageId, kind: "reading", performedAt: "2026-06-15T08:00", ...over });

describe("bad input is refused beside its field", () => {
  it("refuses a zero factor, a negative titrant volume, a pH outside 0–14 and limits in the wrong order", () => {
    const factor = detergentSchema.safeParse({ name: "X", factorPctPerMl: "0" });
    expect(factor.error?.issues.map((i) => i.path.join("."))).toEqual(["factorPctPerMl"]);
    const volume = bathRecordSchema.safeParse({
      stageId,
      kind: "reading",
      performedAt: "2026-06-15T08:00",
      titrantVolumeMl: "-1",
    });
    expect(volume.error?.issues.map((i) => i.path.join("."))).toEqual(["titrantVolumeMl"]);
    const ph = bathRecordSchema.safeParse({
      stageId,
      kind: "reading",
      performedAt: "2026-06-15T08:00",
      ph: "14.5",
    });
    expect(ph.error?.issues.map((i) => i.path.join("."))).toEqual(["ph"]);
    const order = bathLimitSchema.safeParse({
      stageId,
      recipeVersionId: effectiveVersionId,
      variable: "ph",
      actionLow: "11",
      rejectLow: "12",
      rejectHigh: "13",
    });
    expect(order.error?.issues.map((i) => i.path.join("."))).toEqual(["actionLow"]);
  });
});

describe("measurement plan", () => {
  it("takes concentration limits from the recipe version in force and refuses any beyond its validated range", async () => {
    // R-AW3-VB validates the wash concentration 2–4 % (demo data): blank reject limits take that range.
    const row = await setBathLimit(
      engineer,
      limit({ variable: "concentrationPct", detergentId, actionLow: "2.5", actionHigh: "3.5" }),
    );
    expect([row.rejectLow, row.target, row.rejectHigh]).toEqual([2, 3, 4]);
    await expect(
      setBathLimit(
        engineer,
        limit({
          variable: "concentrationPct",
          actionLow: "2.5",
          actionHigh: "3.5",
          rejectHigh: "5",
        }),
      ),
    ).rejects.toMatchObject({ field: "rejectHigh" });
    const [superseded] = await t.db
      .select({ id: recipeVersions.id })
      .from(recipeVersions)
      .where(eq(recipeVersions.status, "superseded"));
    await expect(
      setBathLimit(
        engineer,
        limit({
          variable: "ph",
          recipeVersionId: superseded.id,
          actionLow: "10",
          actionHigh: "12",
        }),
      ),
    ).rejects.toMatchObject({ field: "recipeVersionId" });
    await setBathLimit(
      engineer,
      limit({
        variable: "ph",
        actionLow: "10",
        actionHigh: "12",
        rejectLow: "9",
        rejectHigh: "13",
      }),
    );
  });

  it("bounds a wash tank's temperature by the recipe's wash stage, not by its rinse", async () => {
    // R-AW3-VB v2 (demo data): wash 50–65 °C at 60 °C; its rinse, listed later, 35–55 °C.
    const row = await setBathLimit(
      engineer,
      limit({ variable: "temperatureC", actionLow: "55", actionHigh: "63" }),
    );
    expect([row.rejectLow, row.target, row.rejectHigh]).toEqual([50, 60, 65]);
  });

  it("turns a titration into a concentration, queues a reading beyond an action limit and flags one beyond reject", async () => {
    // [practice] 6.2 mL × 0.5 %/mL = 3.1 %: within the action limits.
    const ok = await recordBathEntry(
      tech,
      reading({ titrantVolumeMl: "6.2" }),
      new Date("2026-06-16T00:00:00Z"),
    );
    expect(ok.concentrationPct).toBe(3.1);
    expect(ok.limitState).toBe("ok");
    expect(ok.titrationFactor).toBe(0.5);

    const action = await recordBathEntry(
      tech,
      reading({ titrantVolumeMl: "7.4", performedAt: "2026-06-15T09:00" }),
      new Date("2026-06-16T00:00:00Z"),
    );
    expect(action.limitState).toBe("action");
    let queue = (await bathLimitsQueueProvider(techUser(), new Date())).items.filter((i) =>
      i.href.endsWith(stageId),
    );
    expect(queue.map((i) => i.kind)).toEqual([BATH_ACTION_KIND]);

    const reject = await recordBathEntry(
      tech,
      reading({ ph: "13.4", performedAt: "2026-06-15T10:00" }),
      new Date("2026-06-16T00:00:00Z"),
    );
    expect(reject.limitState).toBe("reject");
    expect(reject.limitFindings).toBe("pH 13.4 is above the reject limit 13");
    const flagged = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.action, "bath_record.flagged"), eq(auditEvents.recordId, reject.id)),
      );
    expect(flagged).toHaveLength(1);
    // The same reading opened its nonconformance, on the recipe the tank's plan was taken from.
    const ncs = await t.db
      .select()
      .from(nonconformances)
      .where(
        and(
          eq(nonconformances.sourceKind, "bath_reading"),
          eq(nonconformances.sourceId, reject.id),
        ),
      );
    expect(ncs).toHaveLength(1);
    const [aw3] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    expect(ncs[0]).toMatchObject({
      recipeId: aw3.id,
      partFamilyId: null,
      detectedOn: "2026-06-15",
      description: "pH 13.4 is above the reject limit 13",
      sourceLabel: "AW-3 · Test tank reading 2026-06-15",
      status: "open",
      openedBy: tech.id,
    });
    queue = (await bathLimitsQueueProvider(techUser(), new Date())).items.filter((i) =>
      i.href.endsWith(stageId),
    );
    expect(queue.map((i) => i.kind)).toEqual([BATH_REJECT_KIND]);

    // Measured again within limits: the item leaves the queue.
    await recordBathEntry(
      tech,
      reading({ ph: "11.2", performedAt: "2026-06-15T11:00" }),
      new Date("2026-06-16T00:00:00Z"),
    );
    queue = (await bathLimitsQueueProvider(techUser(), new Date())).items.filter((i) =>
      i.href.endsWith(stageId),
    );
    expect(queue).toEqual([]);
    expect((await latestGradedByTank()).get(stageId)?.limitState).toBe("ok");
  });

  it("refuses a titration with no detergent to take the factor from", async () => {
    const [other] = await t.db
      .select()
      .from(systemStages)
      .where(eq(systemStages.name, "Tank 2 — rinse"));
    await expect(
      recordBathEntry(
        tech,
        bathRecordSchema.parse({
          stageId: other.id,
          kind: "reading",
          performedAt: "2026-06-15T08:00",
          titrantVolumeMl: "5",
        }),
      ),
    ).rejects.toMatchObject({ field: "detergentId" });
    const rows = await t.db.select().from(bathRecords).where(eq(bathRecords.stageId, other.id));
    expect(rows.every((r) => r.titrantVolumeMl === null)).toBe(true);
  });

  it("counts the bath's age in days from its last dump and recharge", async () => {
    await recordBathEntry(
      tech,
      reading({ kind: "bath_change", performedAt: "2026-06-10T07:00" }),
      new Date("2026-06-16T00:00:00Z"),
    );
    const now = new Date("2026-06-15T07:00:00Z");
    const before = (await bathAge(t.db, stageId, now)).cycles!;
    // Cycles on the tank's washer: one before the charge and one after "now" do not count.
    const run = (cycleNumber: string, startedAt: string, endedAt: string) =>
      cycleInputSchema.parse({
        cycleNumber,
        system: "AW-3",
        recipe: "R-AW3-VB",
        partFamily: "PF-VB-210",
        lots: ["BATH-AGE-1"],
        baskets: 2,
        startedAt,
        endedAt,
        operator: "B. Operator",
        values: { "wash.temperature": 60, "wash.time": 240, "drying.temperature": 110 },
      });
    await recordCycles(tech, {
      source: "form",
      cycles: [
        run("AGE-0", "2026-06-09 06:00", "2026-06-09 06:40"),
        run("AGE-1", "2026-06-12 06:00", "2026-06-12 06:40"),
        run("AGE-2", "2026-06-14 06:00", "2026-06-14 06:40"),
        run("AGE-3", "2026-06-16 06:00", "2026-06-16 06:40"),
      ],
    });
    const age = await bathAge(t.db, stageId, now);
    expect(age).toMatchObject({
      chargedAt: "2026-06-10T07:00:00.000Z",
      recharged: true,
      days: 5,
      cycles: before + 2,
    });
  });
});

describe("POST /api/v1/bath-readings", () => {
  const call = (token: string, body: unknown) =>
    bathReadingsRoute.POST(
      new Request("http://127.0.0.1/api/v1/bath-readings", {
        method: "POST",
        headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
        body: JSON.stringify(body),
      }),
      { params: Promise.resolve({}) },
    );

  it("records through the tank page's service, grades the reading and names the token in the audit trail", async () => {
    const { token, id: tokenId } = await createApiToken(tech, {
      name: "Dosing controller",
      scope: "read_write",
    });
    const res = await call(token, {
      stageId,
      kind: "reading",
      performedAt: "2026-06-15T12:00",
      titrantVolumeMl: 8.4,
    });
    expect(res.status).toBe(201);
    const body = await res.json();
    // [practice] 8.4 mL × 0.5 %/mL = 4.2 %, above the 4 % reject limit the recipe validated.
    expect(body).toMatchObject({ concentrationPct: 4.2, limitState: "reject" });
    expect(body.findings).toEqual(["Detergent concentration 4.2 % is above the reject limit 4 %"]);
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "bath_record.flagged"), eq(auditEvents.recordId, body.id)));
    expect(event.actorName).toContain(tokenId);
  });

  it("is described in the OpenAPI document with its body and access", async () => {
    const doc = await openapiRoute.GET().json();
    const op = doc.paths["/bath-readings"].post;
    expect(op.operationId).toBe("recordBathReading");
    expect(op.description ?? op.summary).toBeDefined();
    expect(JSON.stringify(op.requestBody)).toContain("titrantVolumeMl");
    expect(Object.keys(op.responses)).toContain("201");
  });

  it("refuses bad values and unknown keys with the field named, writing nothing", async () => {
    const { token } = await createApiToken(tech, { name: "Lab system", scope: "read_write" });
    const before = (await t.db.select().from(bathRecords)).length;
    const ph = await call(token, {
      stageId,
      kind: "reading",
      performedAt: "2026-06-15T12:00",
      ph: 15,
    });
    expect(ph.status).toBe(422);
    expect((await ph.json()).fieldErrors.ph).toBeDefined();
    const extra = await call(token, {
      stageId,
      kind: "reading",
      performedAt: "2026-06-15T12:00",
      PH: 7,
    });
    expect(extra.status).toBe(422);
    const read = await createApiToken(tech, { name: "Read only", scope: "read" });
    expect(
      (
        await call(read.token, {
          stageId,
          kind: "reading",
          performedAt: "2026-06-15T12:00",
          ph: 11,
        })
      ).status,
    ).toBe(403);
    expect((await t.db.select().from(bathRecords)).length).toBe(before);
  });
});

describe("equipment checks", () => {
  it("keeps a nozzle check's result with its photo, and refuses a photo that is not an image", async () => {
    const dir = mkdtempSync(join(tmpdir(), "washproof-bath-photo-"));
    setStore(localStore(dir));
    try {
      const photo = await storeCheckPhoto(tech, { name: "nozzles.png", bytes: PNG });
      const row = await recordBathEntry(
        tech,
        bathRecordSchema.parse({
          stageId,
          kind: "nozzle_check",
          performedAt: "2026-06-15T13:00",
          checkResult: "fail",
          photoFileId: photo.id,
        }),
        new Date("2026-06-16T00:00:00Z"),
      );
      expect([row.checkResult, row.photoFileId]).toEqual(["fail", photo.id]);
      await expect(storeCheckPhoto(tech, { name: "report.pdf", bytes: PDF })).rejects.toMatchObject(
        { field: "file" },
      );
      // A check without its result is refused beside the field.
      const missing = bathRecordSchema.safeParse({
        stageId,
        kind: "ultrasonic_foil_test",
        performedAt: "2026-06-15T13:00",
      });
      expect(missing.error?.issues.map((i) => i.path.join("."))).toEqual(["checkResult"]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it("puts a check interval through the same due states as bath and filter changes", () => {
    const since = "2026-05-01T00:00:00.000Z";
    const lastDoneAt = "2026-06-01T08:00:00.000Z";
    const status = (now: string) =>
      maintenanceStatus({ intervalDays: 14, warnDays: 2, lastDoneAt, since }, new Date(now)).state;
    // [derived] due 14 days after 1 June 08:00 = 15 June 08:00; shown as due from 13 June 08:00.
    expect(status("2026-06-13T07:59:00Z")).toBe("ok");
    expect(status("2026-06-13T08:00:00Z")).toBe("due");
    expect(status("2026-06-15T08:01:00Z")).toBe("overdue");
  });
});
