import { and, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as cyclesRoute from "@/app/api/v1/cycles/route";
import {
  auditEvents,
  nonconformanceItems,
  nonconformances,
  requalificationMatrixRows,
  users,
  washCycleLots,
  washCycles,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { cycleFlags, type CycleParameter } from "@/lib/cycles/flag";
import { inForceAt } from "@/lib/cycles/in-force";
import {
  cycleInputSchema,
  cycleTimeToIso,
  lotFromPath,
  type CycleInputRaw,
} from "@/lib/schemas/cycle";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { loadLotHistory, searchLots } from "@/lib/server/cycles/lot-history";
import { recordCycles } from "@/lib/server/cycles/record-cycles-now";
import { CycleRecordingError } from "@/lib/server/cycles/record-cycles";
import { getEffectiveMatrix } from "@/lib/server/changes/state";
import { createTestDatabase } from "./support/test-db";

const temperature: CycleParameter = {
  key: "wash.temperature",
  name: "Bath temperature",
  kind: "temperature",
  unit: "°C",
  validatedLow: 50,
  validatedHigh: 65,
  critical: true,
};
const vacuum: CycleParameter = {
  key: "drying.vacuum",
  name: "Vacuum end pressure",
  kind: "vacuum_pressure",
  unit: "mbar",
  validatedLow: 10,
  validatedHigh: 50,
  critical: false,
};
const concentration: CycleParameter = {
  key: "wash.concentration",
  name: "Detergent concentration",
  kind: "concentration",
  unit: "%",
  validatedLow: 2,
  validatedHigh: 4,
  critical: true,
};

describe("cycle flagging against the validated range", () => {
  it("passes values inside the range, bounds included [practice: the validated window is closed]", () => {
    expect(
      cycleFlags([temperature, vacuum], { "wash.temperature": 50, "drying.vacuum": 50 }),
    ).toEqual([]);
    expect(cycleFlags([temperature], { "wash.temperature": 65 })).toEqual([]);
  });

  it("flags a value below or above its range, naming the value, the side and the range", () => {
    expect(cycleFlags([temperature], { "wash.temperature": 47.5 })).toEqual([
      "Bath temperature 47.5 °C is below its validated range 50–65 °C.",
    ]);
    expect(cycleFlags([vacuum], { "drying.vacuum": 51 })).toEqual([
      "Vacuum end pressure 51 mbar is above its validated range 10–50 mbar.",
    ]);
  });

  it("flags a critical measured value the cycle did not record, but not a bath reading or an optional one", () => {
    expect(cycleFlags([temperature, vacuum, concentration], {})).toEqual([
      "Bath temperature was not recorded.",
    ]);
  });

  it("judges a one-sided range on its one side", () => {
    const atMost = { ...vacuum, validatedLow: null };
    expect(cycleFlags([atMost], { "drying.vacuum": 2 })).toEqual([]);
    expect(cycleFlags([atMost], { "drying.vacuum": 60 })[0]).toMatch(
      /above its validated range ≤ 50 mbar/,
    );
  });
});

describe("the version in force at a cycle's start", () => {
  const v1 = {
    version: 1,
    status: "superseded",
    effectiveFrom: "2025-03-10T07:00:00.000Z",
    effectiveTo: "2025-09-01T07:00:00.000Z",
  };
  it("runs from its effective time, inclusive, to the time it was superseded, exclusive", () => {
    expect(inForceAt(v1, "2025-03-10T06:59:59.000Z")).toBe(false);
    expect(inForceAt(v1, "2025-03-10T07:00:00.000Z")).toBe(true);
    expect(inForceAt(v1, "2025-09-01T06:59:00.000Z")).toBe(true);
    expect(inForceAt(v1, "2025-09-01T07:00:00.000Z")).toBe(false);
  });
  it("never counts a draft or a proposal", () => {
    expect(inForceAt({ ...v1, status: "proposed" }, "2025-04-01T00:00:00.000Z")).toBe(false);
  });
});

describe("cycle times as a washer's log writes them", () => {
  it("reads a time without a zone as UTC and one with a zone as that zone", () => {
    expect(cycleTimeToIso("2026-03-04 06:15")).toBe("2026-03-04T06:15:00.000Z");
    expect(cycleTimeToIso("2026-03-04T06:15:30+01:00")).toBe("2026-03-04T05:15:30.000Z");
    expect(cycleTimeToIso("2026-03-04T06:15:30Z")).toBe("2026-03-04T06:15:30.000Z");
  });
  it("refuses a day the month does not have and a time of day that does not exist", () => {
    expect(cycleTimeToIso("2026-04-31 06:00")).toBeNull();
    expect(cycleTimeToIso("2026-04-01 24:10")).toBeNull();
    expect(cycleTimeToIso("04/01/2026 06:00")).toBeNull();
  });
  it("refuses an end before the start beside the end field", () => {
    const r = cycleInputSchema.safeParse({
      cycleNumber: "X-1",
      system: "AW-3",
      recipe: "R-AW3-VB",
      partFamily: "PF-VB-210",
      lots: ["L1"],
      baskets: 1,
      startedAt: "2026-03-04 07:00",
      endedAt: "2026-03-04 06:00",
      operator: "A. Operator",
    });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => [i.path.join("."), i.message])).toEqual([
      ["endedAt", "The end is before the start."],
    ]);
  });
});

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let tech: { id: string; name: string };
let writeToken = "";
let readToken = "";

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  const [u] = await t.db.select().from(users).where(eq(users.email, "technician@fennmoor.example"));
  tech = { id: u.id, name: u.name };
  writeToken = (await createApiToken(tech, { name: "AW-3 feed", scope: "read_write" })).token;
  readToken = (await createApiToken(tech, { name: "Dashboard", scope: "read" })).token;
}, 120_000);
afterAll(() => t?.cleanup());

// Valve body VB-210 on R-AW3-VB v2, in force from 2025-09-01 [db/seed-data.ts]; wash 50–65 °C.
const cycle = (over: Partial<CycleInputRaw> = {}) =>
  cycleInputSchema.parse({
    cycleNumber: "AW3-TEST-001",
    system: "AW-3",
    recipe: "R-AW3-VB",
    partFamily: "PF-VB-210",
    lots: ["TEST-LOT-1"],
    baskets: 2,
    startedAt: "2025-10-01 06:00",
    endedAt: "2025-10-01 06:40",
    operator: "B. Operator",
    values: { "wash.temperature": 60, "wash.time": 240, "drying.temperature": 110 },
    ...over,
  });

const refusal = async (input: Parameters<typeof recordCycles>[1]) => {
  const error = await recordCycles(tech, input).catch((e: unknown) => e);
  expect(error).toBeInstanceOf(CycleRecordingError);
  return error as CycleRecordingError;
};

describe("the effective requalification matrix", () => {
  it("keeps each row's minimum of distinct cycles, so a change asks what the matrix states", async () => {
    const row = (await getEffectiveMatrix(t.db))!.rows[0];
    await t.db
      .update(requalificationMatrixRows)
      .set({ minCycles: 2 })
      .where(eq(requalificationMatrixRows.id, row.id));
    const matrix = await getEffectiveMatrix(t.db);
    const loaded = matrix!.rows.find((r) => r.id === row.id);
    expect(loaded?.minCycles).toBe(2);
    await t.db
      .update(requalificationMatrixRows)
      .set({ minCycles: row.minCycles ?? 3 })
      .where(eq(requalificationMatrixRows.id, row.id));
  });
});

describe("recording cycles", () => {
  it("seeds a few hundred demo cycles with lots, one of them flagged", async () => {
    const [{ n, flagged }] = await t.db
      .select({ n: sql<number>`count(*)`, flagged: sql<number>`sum(${washCycles.flagged})` })
      .from(washCycles);
    expect(Number(n)).toBeGreaterThan(200);
    expect(Number(flagged)).toBe(1);
  });

  it("records a cycle on the version in force, with its lots and one audit event", async () => {
    const result = await recordCycles(tech, { source: "form", cycles: [cycle()] });
    expect(result.recorded).toBe(1);
    const [row] = await t.db
      .select()
      .from(washCycles)
      .where(eq(washCycles.cycleNumber, "AW3-TEST-001"));
    expect(row.flagged).toBe(false);
    expect(
      await t.db.select().from(washCycleLots).where(eq(washCycleLots.cycleId, row.id)),
    ).toEqual([{ lotNumber: "TEST-LOT-1", cycleId: row.id }]);
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.recordId, result.batchId));
    expect(events.map((e) => e.action)).toEqual(["wash_cycles.recorded"]);
  });

  it("flags an out-of-range cycle with its reason and audits the flag", async () => {
    const result = await recordCycles(tech, {
      source: "api",
      cycles: [
        cycle({
          cycleNumber: "AW3-TEST-002",
          values: { "wash.temperature": 67, "wash.time": 240, "drying.temperature": 110 },
        }),
      ],
    });
    expect(result.flagged[0].reasons).toEqual([
      "Bath temperature 67 °C is above its validated range 50–65 °C.",
    ]);
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(
          eq(auditEvents.action, "wash_cycle.flagged"),
          eq(auditEvents.recordId, result.flagged[0].id),
        ),
      );
    expect(JSON.parse(event.newValue!).reasons).toEqual(result.flagged[0].reasons);
    // The same recording opened its nonconformance, dated on the cycle's start.
    const [nc] = await t.db
      .select()
      .from(nonconformances)
      .where(
        and(
          eq(nonconformances.sourceKind, "cycle"),
          eq(nonconformances.sourceId, result.flagged[0].id),
        ),
      );
    expect(nc).toMatchObject({
      sourceLabel: "AW-3 cycle AW3-TEST-002",
      detectedOn: "2025-10-01",
      description: "Bath temperature 67 °C is above its validated range 50–65 °C.",
      status: "open",
    });
    const items = await t.db
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, nc.id));
    // Containment: the cycles on the recipe and family since the last passing test, with their lots.
    const mine = items
      .filter((i) => i.label.startsWith("AW-3 cycle AW3-TEST-00"))
      .toSorted((a, b) => a.label.localeCompare(b.label));
    expect(mine.map((i) => [i.itemKind, i.label, i.lots])).toEqual([
      ["cycle", "AW-3 cycle AW3-TEST-001", ["TEST-LOT-1"]],
      ["cycle", "AW-3 cycle AW3-TEST-002", ["TEST-LOT-1"]],
    ]);
    // The lot's history names it through its cycles.
    const h = await loadLotHistory(t.db, "TEST-LOT-1");
    const named = h.nonconformances.find((n) => n.id === nc.id);
    expect(named?.names).toEqual(["AW-3 cycle AW3-TEST-001", "AW-3 cycle AW3-TEST-002"]);
  });

  it("refuses a version that was not in force at the start, naming the version field", async () => {
    const e = await refusal({
      source: "form",
      cycles: [cycle({ cycleNumber: "AW3-TEST-003", version: 1 })],
    });
    expect(e.field).toBe("version");
    expect(e.message).toMatch(
      /R-AW3-VB v1 was not in force at the cycle's start \(2025-10-01 06:00 UTC\): v2 was\./,
    );
  });

  it("refuses a combination that is not qualified, naming the part family", async () => {
    const e = await refusal({
      source: "form",
      cycles: [cycle({ cycleNumber: "AW3-TEST-004", partFamily: "PF-PH-400" })],
    });
    expect(e.field).toBe("partFamily");
    expect(e.message).toMatch(/PF-PH-400 is not qualified on R-AW3-VB v2/);
  });

  it("refuses a duplicate cycle id on the washer, and a parameter the version lacks", async () => {
    expect((await refusal({ source: "form", cycles: [cycle()] })).field).toBe("cycleNumber");
    const e = await refusal({
      source: "form",
      cycles: [cycle({ cycleNumber: "AW3-TEST-005", values: { "wash.colour": 3 } })],
    });
    expect(e.field).toBe("values.wash.colour");
  });

  it("refuses a whole batch for one bad cycle, naming each by its place, and writes nothing", async () => {
    const before = await t.db.select({ n: sql<number>`count(*)` }).from(washCycles);
    const e = await refusal({
      source: "csv",
      cycles: [
        cycle({ cycleNumber: "AW3-TEST-010" }),
        cycle({ cycleNumber: "AW3-TEST-010" }),
        cycle({
          cycleNumber: "AW3-TEST-011",
          startedAt: "2024-01-01 06:00",
          endedAt: "2024-01-01 07:00",
        }),
      ],
    });
    expect(e.problems.map((p) => [p.index, p.field])).toEqual([
      [1, "cycleNumber"],
      [2, "version"],
    ]);
    expect(e.fieldErrors).toMatchObject({ "cycles.1.cycleNumber": [expect.any(String)] });
    expect(await t.db.select({ n: sql<number>`count(*)` }).from(washCycles)).toEqual(before);
  });
});

describe("lot history", () => {
  it("gathers a demo lot's cycles, recipe version, bath state before each cycle and the runs of its parts", async () => {
    // The first valve-body run (2025-04-08) took one part from each of that morning's three cycles [db/seed-evidence.ts].
    const h = await loadLotHistory(t.db, "VB210-250408");
    expect(h.cycles.map((c) => c.cycleNumber)).toEqual([
      "AW3-250408-T1",
      "AW3-250408-T2",
      "AW3-250408-T3",
    ]);
    expect(h.cycles.every((c) => c.recipe === "R-AW3-VB" && c.version === 1)).toBe(true);
    expect(h.runs).toHaveLength(1);
    expect(h.runs[0].cycles.map((c) => c.samples)).toEqual([1, 1, 1]);
    expect(h.cycles[0].bath.length).toBeGreaterThan(0);
  });

  it("takes the newest bath reading at or before the cycle's start, never one after", async () => {
    const recent = await searchLots(t.db, "");
    expect(recent.length).toBeGreaterThan(0);
    const h = await loadLotHistory(t.db, recent[0].lot);
    for (const c of h.cycles)
      for (const tank of c.bath)
        if (tank.reading) expect(tank.reading.performedAt <= c.startedAt).toBe(true);
  });

  it("prints the history as a PDF through the render worker's job, with the lot and its cycles in the text", async () => {
    const { renderJob } = await import("@/lib/pdf/jobs");
    const history = await loadLotHistory(t.db, "VB210-250408");
    const bytes = await renderJob({
      kind: "lot-history",
      input: {
        history,
        letterhead: { companyName: "Fennmoor Fluidtech", siteName: null },
        printedAt: "2026-12-02T10:00:00.000Z",
        printedBy: "Margit Olsen",
      },
    });
    expect(bytes.subarray(0, 5).toString()).toBe("%PDF-");
    expect(bytes.length).toBeGreaterThan(2000);
  });

  it("reads a lot from a URL segment without throwing on a stray percent sign", () => {
    expect(lotFromPath("VB210-250408").data).toBe("VB210-250408");
    expect(lotFromPath("A%2FB").data).toBe("A/B");
    expect(lotFromPath("%").success).toBe(false);
  });

  it("finds lots by the start of their number and answers an unknown lot with nothing", async () => {
    const found = await searchLots(t.db, "VB210-2504");
    expect(found.map((l) => l.lot)).toContain("VB210-250408");
    expect(found.every((l) => l.lot.startsWith("VB210-2504"))).toBe(true);
    expect(await loadLotHistory(t.db, "NO-SUCH-LOT")).toEqual({
      lot: "NO-SUCH-LOT",
      cycles: [],
      runs: [],
      nonconformances: [],
    });
  });
});

describe("/api/v1/cycles", () => {
  const BASE = "http://127.0.0.1/api/v1";
  const noParams = { params: Promise.resolve({}) };
  const post = (token: string, body: unknown) =>
    cyclesRoute.POST(
      new Request(`${BASE}/cycles`, {
        method: "POST",
        headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
        body: JSON.stringify(body),
      }),
      noParams,
    );
  const body = (over: Record<string, unknown> = {}) => ({
    cycleNumber: "AW3-API-001",
    system: "AW-3",
    recipe: "R-AW3-VB",
    partFamily: "PF-VB-210",
    lots: ["API-LOT-1"],
    baskets: 3,
    startedAt: "2025-10-02T06:00:00Z",
    endedAt: "2025-10-02T06:45:00Z",
    operator: "Feed",
    values: { "wash.temperature": 61, "wash.time": 250, "drying.temperature": 110 },
    ...over,
  });

  it("records a batch with a read-write token and lists it back by lot", async () => {
    const res = await post(writeToken, { cycles: [body(), body({ cycleNumber: "AW3-API-002" })] });
    expect(res.status).toBe(201);
    expect((await res.json()).recorded).toBe(2);
    const list = await cyclesRoute.GET(
      new Request(`${BASE}/cycles?lot=API-LOT-1`, {
        headers: { authorization: `Bearer ${readToken}` },
      }),
      noParams,
    );
    const page = await list.json();
    expect(page.data.map((c: { cycleNumber: string }) => c.cycleNumber).sort()).toEqual([
      "AW3-API-001",
      "AW3-API-002",
    ]);
  });

  it("refuses a read-only token, a duplicate cycle id (422 naming the field) and an unknown key", async () => {
    expect((await post(readToken, body({ cycleNumber: "AW3-API-003" }))).status).toBe(403);
    const dup = await post(writeToken, body());
    expect(dup.status).toBe(422);
    expect((await dup.json()).fieldErrors).toHaveProperty("cycleNumber");
    expect(
      (await post(writeToken, body({ cycleNumber: "AW3-API-004", colour: "red" }))).status,
    ).toBe(422);
  });
});
