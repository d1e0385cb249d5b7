import { desc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { setUpPlantAction } from "@/app/(auth)/set-up/actions";
import {
  createSystemAction,
  retireSystemAction,
  updateSystemAction,
} from "@/app/(app)/systems/actions";
import {
  auditEvents,
  changeRequests,
  cleaningSystems,
  sites,
  systemStages,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { ALREADY_SET_UP } from "@/lib/server/plant/set-up-plant";
import { actAs, changedTables, invoke, tableCounts } from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}
const payload = (value: unknown) => form({ payload: JSON.stringify(value) });

// Invented company and people.
const setUp = {
  companyName: "Harrowgate Hydraulik GmbH",
  siteName: "Werk Tallbrook",
  siteLocation: "",
  adminName: "Odile Marchetti",
  adminEmail: "odile@harrowgate.example",
  password: "Violet-gantry-Kestrel-48",
  confirmPassword: "Violet-gantry-Kestrel-48",
};

describe("the one-time set-up page's action, on an empty database", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    t = await createTestDatabase();
  });
  afterAll(() => t.cleanup());

  it("refuses a guessable password beside the field and writes nothing", async () => {
    await actAs(null);
    const before = await tableCounts(t.client);
    const outcome = await invoke(() =>
      setUpPlantAction(
        null,
        form({ ...setUp, password: "password1234", confirmPassword: "password1234" }),
      ),
    );
    expect(outcome.kind).toBe("result");
    if (outcome.kind !== "result") return;
    expect(outcome.value.ok).toBe(false);
    expect(
      (outcome.value as { fieldErrors?: Record<string, string[]> }).fieldErrors?.password?.[0],
    ).toMatch(/./);
    expect(changedTables(before, await tableCounts(t.client))).toEqual([]);
  });

  it("signed out, creates the first administrator and sends them to sign in; a second call is refused and writes nothing", async () => {
    await actAs(null);
    const first = await invoke(() => setUpPlantAction(null, form(setUp)));
    expect(first).toEqual({ kind: "redirect", to: "/sign-in?set-up=done" });
    const [admin] = await t.db.select().from(users);
    expect(admin.email).toBe("odile@harrowgate.example");

    const before = await tableCounts(t.client);
    const second = await invoke(() =>
      setUpPlantAction(null, form({ ...setUp, adminEmail: "intruder@elsewhere.example" })),
    );
    expect(second).toMatchObject({ kind: "result", value: { ok: false, message: ALREADY_SET_UP } });
    expect(changedTables(before, await tableCounts(t.client))).toEqual([]);
    expect(await t.db.select().from(users)).toHaveLength(1);
  });
});

describe("cleaning-system actions", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  let admin: { id: string };
  let siteId: string;
  beforeAll(async () => {
    t = await createTestDatabase();
    await seedDemo(t.db);
    [admin] = await t.db
      .select({ id: users.id })
      .from(users)
      .where(eq(users.email, "admin@fennmoor.example"));
    siteId = (await t.db.select().from(sites))[0].id;
  });
  afterAll(() => t.cleanup());

  // As the editor sends it: numbers as typed text, empty for a figure not given.
  const stage = (
    name: string,
    kind: string,
    capabilities: string[],
    extra: Record<string, string> = {},
  ) => ({
    id: null,
    name,
    kind,
    capabilities,
    tankVolumeL: "",
    filterRatingUm: "",
    ultrasonicPowerW: "",
    ultrasonicFrequencyKHz: "",
    sprayPressureBar: "",
    injectionPressureBar: "",
    nozzleSet: "",
    ...extra,
  });
  const washer = {
    code: "AW-9",
    assetNumber: "HH-4410",
    name: "Four-tank line",
    kind: "multi_tank_aqueous",
    description: "",
    siteId: "",
    stages: [
      stage("Ultrasonic wash", "wash", ["ultrasonic", "flood"], {
        tankVolumeL: "800",
        filterRatingUm: "25",
        ultrasonicPowerW: "8000",
        ultrasonicFrequencyKHz: "40",
      }),
      stage("Spray rinse", "rinse", ["spray"], {
        tankVolumeL: "600",
        sprayPressureBar: "4",
        nozzleSet: "NS-12",
      }),
      stage("DI rinse", "final_rinse", ["flood"], { tankVolumeL: "600", filterRatingUm: "5" }),
      stage("Vacuum dryer", "drying", ["vacuum_drying"]),
    ],
  };

  it("creates a four-stage washer and goes to its page", async () => {
    await actAs(admin);
    const outcome = await invoke(() => createSystemAction(null, payload({ ...washer, siteId })));
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-9"));
    expect(outcome).toEqual({ kind: "redirect", to: `/systems/${sys.id}` });
    const stages = await t.db.select().from(systemStages).where(eq(systemStages.systemId, sys.id));
    expect(stages.find((s) => s.name === "Spray rinse")).toMatchObject({
      sprayPressureBar: 4,
      nozzleSet: "NS-12",
      position: 2,
    });
  });

  it("answers a duplicate asset number and stages out of order beside their fields, writing nothing", async () => {
    await actAs(admin);
    const before = await tableCounts(t.client);
    const duplicate = await invoke(() =>
      createSystemAction(null, payload({ ...washer, code: "AW-10", siteId })),
    );
    expect(duplicate).toMatchObject({
      kind: "result",
      value: {
        ok: false,
        fieldErrors: { assetNumber: ["Asset number HH-4410 is already system AW-9's."] },
      },
    });
    // Dryer before the final rinse, and a spray rinse without its pressure: both shown at once.
    const disordered = {
      ...washer,
      code: "AW-11",
      assetNumber: "",
      stages: [
        washer.stages[0],
        washer.stages[3],
        washer.stages[2],
        { ...washer.stages[1], sprayPressureBar: "" },
      ],
    };
    const out = await invoke(() => createSystemAction(null, payload({ ...disordered, siteId })));
    expect(out.kind).toBe("result");
    const errors =
      (out as { value: { fieldErrors?: Record<string, string[]> } }).value.fieldErrors ?? {};
    expect(Object.keys(errors).sort()).toEqual([
      "stages.2.kind",
      "stages.3.kind",
      "stages.3.sprayPressureBar",
    ]);
    expect(errors["stages.2.kind"][0]).toMatch(
      /Stage 3 \(DI rinse\) is a final rinse after stage 2 \(Vacuum dryer\)/,
    );
    const unknownSite = await invoke(() =>
      createSystemAction(
        null,
        payload({ ...washer, code: "AW-12", assetNumber: "", siteId: crypto.randomUUID() }),
      ),
    );
    expect(unknownSite).toMatchObject({
      kind: "result",
      value: { ok: false, fieldErrors: { siteId: [expect.any(String)] } },
    });
    expect(changedTables(before, await tableCounts(t.client))).toEqual([]);
  });

  it("turns an equipment edit on a washer that runs an effective recipe into an equipment change request, and shows it", async () => {
    await actAs(admin);
    const [sc1] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "SC-1"));
    const stages = await t.db.select().from(systemStages).where(eq(systemStages.systemId, sc1.id));
    const typed = stages
      .sort((a, b) => a.position - b.position)
      .map((s, i) => ({
        id: s.id,
        name: s.name,
        kind: s.kind,
        capabilities: s.capabilities,
        tankVolumeL: s.tankVolumeL ?? "",
        filterRatingUm: i === 0 ? "200" : (s.filterRatingUm ?? ""),
      }));
    const before = await tableCounts(t.client);
    const out = await invoke(() =>
      updateSystemAction(
        null,
        payload({
          systemId: sc1.id,
          name: sc1.name,
          description: sc1.description ?? "",
          stages: typed,
        }),
      ),
    );
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .orderBy(desc(changeRequests.createdAt))
      .limit(1);
    expect(out).toEqual({ kind: "redirect", to: `/changes/${cr.id}` });
    expect(cr.title).toMatch(/^Equipment change on SC-1: /);
    // The washer's stages are untouched; the change request, its proposal and narrative are written.
    expect(changedTables(before, await tableCounts(t.client))).toEqual(
      expect.not.arrayContaining(["system_stages"]),
    );
    expect(changedTables(before, await tableCounts(t.client))).toEqual(
      expect.arrayContaining(["change_requests", "change_request_equipment", "audit_events"]),
    );
  });

  it("retires a washer with its reason in the audit trail; a second retire is refused", async () => {
    await actAs(admin);
    const [aw9] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-9"));
    const out = await invoke(() =>
      retireSystemAction(null, form({ systemId: aw9.id, reason: "Line moved to another plant" })),
    );
    expect(out).toMatchObject({ kind: "result", value: { ok: true } });
    const [event] = (
      await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, aw9.id))
    ).filter((e) => e.action === "cleaning_system.retired");
    expect(event.reason).toBe("Line moved to another plant");
    const again = await invoke(() =>
      retireSystemAction(null, form({ systemId: aw9.id, reason: "Line moved to another plant" })),
    );
    expect(again).toMatchObject({
      kind: "result",
      value: { ok: false, message: "AW-9 is already retired." },
    });
  });
});
