import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { createRecipeAction } from "@/app/(app)/systems/[systemId]/recipes/new/actions";
import { cleaningSystems, recipes } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { actAs, invoke, peopleByRole } from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;
let systemId = "";
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
  systemId = (await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-3")))[0]
    .id;
});
afterAll(() => t.cleanup());

const param = (
  key: string,
  kind: string,
  setpoint: string,
  unit: string,
  low: string,
  high: string,
) => ({
  key,
  name: key,
  kind,
  setpoint,
  unit,
  validatedLow: low,
  validatedHigh: high,
  critical: true,
});
const payload = (drySetpoint: string, code = "R-AW3-UI1") => {
  const fd = new FormData();
  fd.set(
    "payload",
    JSON.stringify({
      systemId,
      code,
      name: "Manifold block from the screen",
      description: "",
      content: {
        detergent: "Alkaline cleaner AC-14",
        notes: "",
        stages: [
          {
            name: "Wash",
            kind: "wash",
            mode: "ultrasonic",
            parameters: [param("wash.temperature", "temperature", "60", "°C", "55", "65")],
          },
          {
            name: "Drying",
            kind: "drying",
            mode: "vacuum_drying",
            parameters: [
              param("drying.temperature", "drying_temperature", drySetpoint, "°C", "100", "120"),
            ],
          },
        ],
      },
    }),
  );
  return fd;
};

describe("the recipe creation screen's action", () => {
  it("refuses a setpoint outside its own range beside that field, saving nothing", async () => {
    await actAs(people.engineer);
    const out = await invoke(() => createRecipeAction(null, payload("130")));
    expect(out.kind).toBe("result");
    const value = (out as { value: { ok: boolean; fieldErrors?: Record<string, string[]> } }).value;
    expect(value.ok).toBe(false);
    expect(Object.keys(value.fieldErrors ?? {})).toContain(
      "content.stages.1.parameters.0.setpoint",
    );
    expect(await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-UI1"))).toHaveLength(0);
  });

  it("is refused to a role the table does not list, and creates the draft for an engineer", async () => {
    await actAs(people.technician);
    const refused = await invoke(() => createRecipeAction(null, payload("110")));
    expect(
      refused.kind === "forbidden" || (refused.kind === "result" && refused.value.ok === false),
    ).toBe(true);
    expect(await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-UI1"))).toHaveLength(0);
    await actAs(people.engineer);
    const out = await invoke(() => createRecipeAction(null, payload("110")));
    const [created] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-UI1"));
    expect(created).toBeDefined();
    expect(out).toEqual({ kind: "redirect", to: `/systems/recipes/${created.id}` });
  });
});
