import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, cleaningSystems, recipeParameters, recipes, recipeStages } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { createRecipeSchema } from "@/lib/schemas/recipe";
import { createRecipe } from "@/lib/server/plant/create-recipe";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const systemId = async (code: string) =>
  (await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, code)))[0].id;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
});
afterAll(() => t.cleanup());

const engineer = { id: null, name: "engineer" } as const;
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
const typed = (system: string) => ({
  systemId: system,
  code: "R-AW3-MN",
  name: "Manifold block, ultrasonic",
  description: "",
  content: {
    detergent: "Alkaline cleaner AC-14",
    notes: "",
    stages: [
      {
        name: "Wash",
        kind: "wash",
        mode: "ultrasonic",
        parameters: [
          param("wash.temperature", "temperature", "60", "°C", "55", "65"),
          param("wash.time", "time", "300", "s", "240", "360"),
        ],
      },
      {
        name: "Final rinse",
        kind: "final_rinse",
        mode: "flood",
        parameters: [
          param("final_rinse.conductivity_limit", "conductivity_limit", "10", "µS/cm", "0", "20"),
        ],
      },
      {
        name: "Drying",
        kind: "drying",
        mode: "vacuum_drying",
        parameters: [param("drying.temperature", "drying_temperature", "110", "°C", "100", "120")],
      },
      {
        name: "Loading",
        kind: "other",
        mode: null,
        parameters: [
          param("loading.pattern", "load_pattern", "3", "pattern no.", "", ""),
          param("loading.parts_per_basket", "basket_loading", "16", "parts/basket", "8", "16"),
        ],
      },
    ],
  },
});

describe("creating a recipe", () => {
  it("writes the recipe and a draft first version with its stages in order, audited", async () => {
    const { recipe, version } = await createRecipe(
      engineer,
      createRecipeSchema.parse(typed(await systemId("AW-3"))),
    );
    expect(version).toMatchObject({ version: 1, status: "draft" });
    const stages = await t.db
      .select()
      .from(recipeStages)
      .where(eq(recipeStages.versionId, version.id));
    expect(stages.sort((a, b) => a.position - b.position).map((s) => s.kind)).toEqual([
      "wash",
      "final_rinse",
      "drying",
      "other",
    ]);
    expect(
      await t.db.select().from(recipeParameters).where(eq(recipeParameters.versionId, version.id)),
    ).toHaveLength(6);
    const actions = (await t.db.select().from(auditEvents))
      .filter((e) => e.recordId === recipe.id || e.recordId === version.id)
      .map((e) => e.action);
    expect(actions).toEqual(["recipe.created", "recipe_version.created"]);
    await expect(
      createRecipe(engineer, createRecipeSchema.parse(typed(await systemId("AW-3")))),
    ).rejects.toThrow("A recipe with the code R-AW3-MN already exists.");
  });

  it("refuses a mode the washer cannot run, naming the stage and the system", async () => {
    const input = createRecipeSchema.parse({ ...typed(await systemId("SC-1")), code: "R-SC1-MN" });
    await expect(createRecipe(engineer, input)).rejects.toMatchObject({
      field: "content.stages.0.mode",
      message: "Stage 1 (Wash): SC-1 has no wash stage that can run ultrasonic.",
    });
    expect(await t.db.select().from(recipes).where(eq(recipes.code, "R-SC1-MN"))).toHaveLength(0);
  });

  it("refuses stages out of process order, a setpoint outside its own range and an impossible value beside their fields", async () => {
    const base = typed(await systemId("AW-3"));
    const [wash, rinse, dry, load] = base.content.stages;
    const bad = {
      ...base,
      content: {
        ...base.content,
        stages: [
          {
            ...wash,
            parameters: [param("wash.temperature", "temperature", "70", "°C", "55", "65")],
          },
          {
            ...dry,
            parameters: [
              param("drying.temperature", "drying_temperature", "1e9", "°C", "100", "120"),
            ],
          },
          rinse,
          load,
        ],
      },
    };
    const issues = createRecipeSchema
      .safeParse(bad)
      .error!.issues.map((i) => [i.path.join("."), i.message]);
    expect(issues).toEqual(
      expect.arrayContaining([
        ["content.stages.1.parameters.0.setpoint", expect.stringMatching(/above 200 °C/)],
        [
          "content.stages.2.kind",
          expect.stringMatching(
            /Stage 3 \(Final rinse\) is a final rinse after stage 2 \(Drying\)/,
          ),
        ],
        [
          "content.stages.0.parameters.0.setpoint",
          "The setpoint 70 °C lies outside its own validated range 55–65 °C.",
        ],
      ]),
    );
  });
});
