import { asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, cleaningSystems, systemStages } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { systemSchema } from "@/lib/schemas/system";
import { updateSystem } from "@/lib/server/systems/update-system";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
});
afterAll(() => t.cleanup());

const admin = { id: null, name: "admin" } as const;

describe("editing a cleaning system", () => {
  it("renames, reorders and adds stages, keeping stage ids, with one audit event", async () => {
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "SC-1"));
    const stages = await t.db.select().from(systemStages).where(eq(systemStages.systemId, sys.id)).orderBy(asc(systemStages.position));
    const input = systemSchema.parse({
      systemId: sys.id,
      name: "Single-chamber spray washer (rebuilt)",
      description: "",
      stages: [
        ...stages.map((s) => ({ id: s.id, name: s.name, kind: s.kind, capabilities: s.capabilities, tankVolumeL: s.tankVolumeL === null ? "" : String(s.tankVolumeL) })).reverse(),
        { id: null, name: "Deionised rinse", kind: "final_rinse", capabilities: ["spray"], tankVolumeL: "300" },
      ],
    });
    await updateSystem(admin, input);
    const after = await t.db.select().from(systemStages).where(eq(systemStages.systemId, sys.id)).orderBy(asc(systemStages.position));
    expect(after.map((s) => s.name)).toEqual(["Hot-air drying", "Spray rinse", "Spray wash", "Deionised rinse"]);
    expect(after.slice(0, 3).map((s) => s.id)).toEqual(stages.map((s) => s.id).reverse());
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, sys.id));
    expect(events.at(-1)?.action).toBe("cleaning_system.updated");
  });

  it("refuses to drop a stage, and bad values name their field", async () => {
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "SC-1"));
    const stages = await t.db.select().from(systemStages).where(eq(systemStages.systemId, sys.id));
    const input = systemSchema.parse({ systemId: sys.id, name: sys.name, description: "", stages: [{ id: stages[0].id, name: stages[0].name, kind: stages[0].kind, capabilities: stages[0].capabilities, tankVolumeL: "" }] });
    await expect(updateSystem(admin, input)).rejects.toThrow(/cannot be removed/);
    const bad = systemSchema.safeParse({ systemId: sys.id, name: "X", description: "", stages: [{ id: null, name: "Tank", kind: "wash", capabilities: [], tankVolumeL: "-5" }] });
    const paths = bad.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["name", "stages.0.capabilities", "stages.0.tankVolumeL"]));
  });
});
