import { asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  changeRequestEquipment,
  changeRequests,
  cleaningSystems,
  sites,
  systemStages,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { createSystemSchema, retireSystemSchema, systemSchema } from "@/lib/schemas/system";
import { createSystem } from "@/lib/server/systems/create-system";
import { retireSystem } from "@/lib/server/systems/retire-system";
import { updateSystem } from "@/lib/server/systems/update-system";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let siteId: string;
const admin = { id: "", name: "admin" };
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  siteId = (await t.db.select().from(sites))[0].id;
  const [u] = await t.db.select().from(users).where(eq(users.email, "admin@fennmoor.example"));
  Object.assign(admin, { id: u.id, name: u.name });
});
afterAll(() => t.cleanup());
const stagesOf = async (systemId: string) =>
  t.db
    .select()
    .from(systemStages)
    .where(eq(systemStages.systemId, systemId))
    .orderBy(asc(systemStages.position));
const asTyped = (s: Awaited<ReturnType<typeof stagesOf>>[number]) => ({
  id: s.id,
  name: s.name,
  kind: s.kind,
  capabilities: s.capabilities,
  tankVolumeL: s.tankVolumeL === null ? "" : String(s.tankVolumeL),
  filterRatingUm: s.filterRatingUm ?? "",
  ultrasonicPowerW: s.ultrasonicPowerW ?? "",
  ultrasonicFrequencyKHz: s.ultrasonicFrequencyKHz ?? "",
  sprayPressureBar: s.sprayPressureBar ?? "",
  injectionPressureBar: s.injectionPressureBar ?? "",
  nozzleSet: s.nozzleSet ?? "",
});

const fourStage = {
  code: "AW-4",
  assetNumber: "ASSET-0457",
  name: "Four-tank aqueous washer",
  kind: "multi_tank_aqueous",
  description: "",
  stages: [
    {
      id: null,
      name: "Ultrasonic wash",
      kind: "wash",
      capabilities: ["ultrasonic", "flood"],
      tankVolumeL: "600",
      filterRatingUm: "25",
      ultrasonicPowerW: "6000",
      ultrasonicFrequencyKHz: "40",
    },
    {
      id: null,
      name: "Spray rinse",
      kind: "rinse",
      capabilities: ["spray"],
      tankVolumeL: "500",
      filterRatingUm: "50",
      sprayPressureBar: "3",
    },
    {
      id: null,
      name: "Deionised rinse",
      kind: "final_rinse",
      capabilities: ["flood"],
      tankVolumeL: "500",
      filterRatingUm: "5",
    },
    {
      id: null,
      name: "Vacuum dryer",
      kind: "drying",
      capabilities: ["vacuum_drying"],
      tankVolumeL: "",
    },
  ],
};

describe("creating a cleaning system", () => {
  it("creates a four-stage washer with its equipment, audited", async () => {
    const sys = await createSystem(admin, { ...createSystemSchema.parse(fourStage), siteId });
    const stages = await stagesOf(sys.id);
    expect(stages.map((s) => [s.position, s.kind])).toEqual([
      [1, "wash"],
      [2, "rinse"],
      [3, "final_rinse"],
      [4, "drying"],
    ]);
    expect(stages[0]).toMatchObject({
      ultrasonicPowerW: 6000,
      ultrasonicFrequencyKHz: 40,
      filterRatingUm: 25,
    });
    const [event] = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, sys.id));
    expect(event.action).toBe("cleaning_system.created");
    expect(event.newValue).toContain("ultrasonic 6000 W at 40 kHz");
  });

  it("refuses a clash of code or asset number, stages out of process order and a mode without its figures", async () => {
    await expect(
      createSystem(admin, { ...createSystemSchema.parse(fourStage), siteId }),
    ).rejects.toThrow("A cleaning system with the code AW-4 already exists.");
    await expect(
      createSystem(admin, { ...createSystemSchema.parse({ ...fourStage, code: "AW-5" }), siteId }),
    ).rejects.toThrow("Asset number ASSET-0457 is already system AW-4's.");
    const reordered = {
      ...fourStage,
      code: "AW-6",
      assetNumber: "",
      stages: [fourStage.stages[0], fourStage.stages[3], fourStage.stages[2]],
    };
    await expect(
      createSystem(admin, { ...createSystemSchema.parse(reordered), siteId }),
    ).rejects.toMatchObject({
      field: "stages.2.kind",
      message: expect.stringMatching(
        /Stage 3 \(Deionised rinse\) is a final rinse after stage 2 \(Vacuum dryer\)/,
      ),
    });
    const noPressure = {
      ...fourStage,
      code: "AW-7",
      assetNumber: "",
      stages: [{ ...fourStage.stages[1], sprayPressureBar: "" }],
    };
    await expect(
      createSystem(admin, { ...createSystemSchema.parse(noPressure), siteId }),
    ).rejects.toMatchObject({ field: "stages.0.sprayPressureBar" });
    expect(
      await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-6")),
    ).toHaveLength(0);
  });
});

describe("editing a cleaning system", () => {
  it("renames and adds stages on a system without effective recipes, keeping stage ids, with one audit event", async () => {
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-4"));
    const stages = await stagesOf(sys.id);
    const input = systemSchema.parse({
      systemId: sys.id,
      name: "Four-tank aqueous washer (rebuilt)",
      description: "",
      stages: [
        ...stages.map(asTyped).slice(0, 3),
        {
          id: null,
          name: "Blow-off",
          kind: "other",
          capabilities: ["spray"],
          tankVolumeL: "",
          sprayPressureBar: "6",
        },
        asTyped(stages[3]),
      ],
    });
    await updateSystem(admin, input);
    const after = await stagesOf(sys.id);
    expect(after.map((s) => s.name)).toEqual([
      "Ultrasonic wash",
      "Spray rinse",
      "Deionised rinse",
      "Blow-off",
      "Vacuum dryer",
    ]);
    expect([...after.slice(0, 3), after[4]].map((s) => s.id)).toEqual(stages.map((s) => s.id));
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, sys.id));
    expect(events.at(-1)?.action).toBe("cleaning_system.updated");
  });

  it("refuses to drop a stage, and bad values name their field", async () => {
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-4"));
    const stages = await stagesOf(sys.id);
    const input = systemSchema.parse({
      systemId: sys.id,
      name: sys.name,
      description: "",
      stages: [asTyped(stages[0])],
    });
    await expect(updateSystem(admin, input)).rejects.toThrow(/cannot be removed/);
    const bad = systemSchema.safeParse({
      systemId: sys.id,
      name: "X",
      description: "",
      stages: [
        {
          id: null,
          name: "Tank",
          kind: "wash",
          capabilities: [],
          tankVolumeL: "-5",
          filterRatingUm: "0",
        },
      ],
    });
    const paths = bad.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(
      expect.arrayContaining([
        "name",
        "stages.0.capabilities",
        "stages.0.tankVolumeL",
        "stages.0.filterRatingUm",
      ]),
    );
  });

  it("once a system runs an effective recipe, an equipment edit opens an equipment change request instead of saving; wording is saved", async () => {
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "SC-1"));
    const stages = await stagesOf(sys.id);
    const before = await t.db.select().from(auditEvents);
    const coarser = systemSchema.parse({
      systemId: sys.id,
      name: sys.name,
      description: sys.description ?? "",
      stages: stages.map((s, i) => ({
        ...asTyped(s),
        filterRatingUm: i === 0 ? "100" : asTyped(s).filterRatingUm,
      })),
    });
    const { changeRequestId } = await updateSystem(admin, coarser);
    expect(changeRequestId).not.toBeNull();
    // The washer keeps its equipment until the change closes; the proposal waits on the request.
    expect((await stagesOf(sys.id)).map((s) => s.filterRatingUm)).toEqual(
      stages.map((s) => s.filterRatingUm),
    );
    const [cr] = await t.db
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.id, changeRequestId!));
    expect(cr.title).toBe(
      "Equipment change on SC-1: Spray wash — Filter rating 50 → 100 µm: coarser filtration leaves more particles in the bath.",
    );
    const [link] = await t.db
      .select()
      .from(changeRequestEquipment)
      .where(eq(changeRequestEquipment.changeRequestId, cr.id));
    expect(link).toMatchObject({ systemId: sys.id, appliedAt: null });
    const added = (await t.db.select().from(auditEvents)).slice(before.length);
    expect(added.map((e) => e.action)).toEqual(["recipe_version.proposed", "change.opened"]);
    // One open equipment change per washer.
    await expect(updateSystem(admin, coarser)).rejects.toThrow(
      `Equipment change ${cr.number} is already open on SC-1: finish or withdraw it first.`,
    );
    const renamed = systemSchema.parse({
      systemId: sys.id,
      name: "Single-chamber spray washer (hall 2)",
      description: "",
      stages: stages.map(asTyped),
    });
    await updateSystem(admin, renamed);
    expect(
      (await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.id, sys.id)))[0].name,
    ).toBe("Single-chamber spray washer (hall 2)");
    // An editor that does not send the equipment fields keeps them rather than erasing them.
    const withoutEquipment = stages.map((s) => ({
      id: s.id,
      name: s.name,
      kind: s.kind,
      capabilities: s.capabilities,
      tankVolumeL: s.tankVolumeL === null ? "" : String(s.tankVolumeL),
    }));
    await updateSystem(
      admin,
      systemSchema.parse({
        systemId: sys.id,
        name: "Single-chamber spray washer",
        description: "",
        stages: withoutEquipment,
      }),
    );
    expect((await stagesOf(sys.id)).map((s) => s.filterRatingUm)).toEqual(
      stages.map((s) => s.filterRatingUm),
    );
  });
});

describe("retiring a cleaning system", () => {
  it("refuses while it runs effective recipes; otherwise retires it with the reason audited, and it can no longer be edited", async () => {
    const [sc1] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "SC-1"));
    await expect(
      retireSystem(
        admin,
        retireSystemSchema.parse({ systemId: sc1.id, reason: "Replaced by AW-4" }),
      ),
    ).rejects.toThrow(/SC-1 still runs R-SC1-SF v2/);
    const [aw4] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-4"));
    await retireSystem(
      admin,
      retireSystemSchema.parse({ systemId: aw4.id, reason: "Sold to another site" }),
    );
    const [row] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.id, aw4.id));
    expect(row).toMatchObject({ active: false, retireReason: "Sold to another site" });
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, aw4.id));
    expect(events.at(-1)).toMatchObject({
      action: "cleaning_system.retired",
      reason: "Sold to another site",
    });
    const stages = await stagesOf(aw4.id);
    await expect(
      updateSystem(
        admin,
        systemSchema.parse({
          systemId: aw4.id,
          name: "X washer",
          description: "",
          stages: stages.map(asTyped),
        }),
      ),
    ).rejects.toThrow("AW-4 is retired");
    expect(
      retireSystemSchema.safeParse({ systemId: aw4.id, reason: "" }).error?.issues[0].path,
    ).toEqual(["reason"]);
  });
});
