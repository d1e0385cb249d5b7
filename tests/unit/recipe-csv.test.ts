import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { NextRequest } from "next/server";
import { auditEvents, recipes, recipeVersions, sites } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { loadRecipeSnapshot } from "@/db/recipe-content";
import { GET as exportRecipe } from "@/app/api/recipes/[recipeId]/csv/route";
import { POST as importRecipe } from "@/app/api/systems/[systemId]/recipes/import/route";
import { parseMasterDataCsv, type ParameterRow } from "@/lib/plant/csv-master-data";
import { columnOf, contentFromRows, RECIPE_CSV_TEMPLATE, recipeToCsv } from "@/lib/recipes/csv";
import { createRecipeSchema } from "@/lib/schemas/recipe";
import { createSystemSchema } from "@/lib/schemas/system";
import { createSystem } from "@/lib/server/systems/create-system";
import { actAs, peopleByRole } from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));

describe("the recipe-parameter CSV format", () => {
  it("the template reads back clean and makes a valid recipe", () => {
    const parsed = parseMasterDataCsv("recipe_parameters", RECIPE_CSV_TEMPLATE);
    expect(parsed.fileErrors).toEqual([]);
    expect(parsed.errors).toEqual([]);
    const { content } = contentFromRows(parsed.rows as ParameterRow[], {
      detergent: "",
      notes: "",
    });
    const recipe = createRecipeSchema.safeParse({
      systemId: crypto.randomUUID(),
      code: "R-T",
      name: "Template",
      description: "",
      content,
    });
    expect(recipe.success).toBe(true);
    expect(content.stages.map((s) => s.kind)).toEqual(["wash", "rinse", "final_rinse", "drying"]);
  });

  it("an exported recipe imports back to the same stages and parameters", () => {
    const parsed = parseMasterDataCsv("recipe_parameters", RECIPE_CSV_TEMPLATE);
    const { content } = contentFromRows(parsed.rows as ParameterRow[], {
      detergent: "",
      notes: "",
    });
    const again = parseMasterDataCsv("recipe_parameters", recipeToCsv(content));
    expect(
      contentFromRows(again.rows as ParameterRow[], { detergent: "", notes: "" }).content,
    ).toEqual(content);
  });

  it("a path the recipe schema reports is named by its file line and column", () => {
    const parsed = parseMasterDataCsv("recipe_parameters", RECIPE_CSV_TEMPLATE);
    const built = contentFromRows(parsed.rows as ParameterRow[], { detergent: "", notes: "" });
    // Rows: 2–4 wash, 5 rinse, 6 final rinse, 7–8 drying.
    expect(built.lineOf("content.stages.3.parameters.1.setpoint")).toBe(8);
    expect(built.lineOf("content.stages.1.mode")).toBe(5);
    expect(built.lineOf("code")).toBeNull();
    expect(columnOf("content.stages.3.parameters.1.validatedLow")).toBe("validated_low");
    expect(columnOf("content.stages.1.mode")).toBe("stage_mode");
    expect(columnOf("content.stages.1.name")).toBe("stage");
  });
});

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;
let systemId: string;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
  const siteId = (await t.db.select().from(sites))[0].id;
  const system = await createSystem(people.admin, {
    ...createSystemSchema.parse({
      code: "AW-CSV",
      assetNumber: "ASSET-CSV-1",
      name: "Four-tank washer for the import",
      kind: "multi_tank_aqueous",
      description: "",
      stages: [
        {
          id: null,
          name: "Ultrasonic wash",
          kind: "wash",
          capabilities: ["ultrasonic", "flood"],
          tankVolumeL: "600",
          ultrasonicPowerW: "6000",
          ultrasonicFrequencyKHz: "40",
        },
        {
          id: null,
          name: "Spray rinse",
          kind: "rinse",
          capabilities: ["spray"],
          tankVolumeL: "500",
          sprayPressureBar: "3",
        },
        {
          id: null,
          name: "DI rinse",
          kind: "final_rinse",
          capabilities: ["flood"],
          tankVolumeL: "500",
        },
        {
          id: null,
          name: "Vacuum dryer",
          kind: "drying",
          capabilities: ["vacuum_drying"],
          tankVolumeL: "",
        },
      ],
    }),
    siteId,
  });
  systemId = system.id;
});
afterAll(() => t.cleanup());

const upload = (fields: Record<string, string>, csv: string) => {
  const body = new FormData();
  for (const [k, v] of Object.entries(fields)) body.set(k, v);
  body.set("file", new File([csv], "recipe.csv", { type: "text/csv" }));
  return importRecipe(
    new NextRequest(`http://127.0.0.1/api/systems/${systemId}/recipes/import`, {
      method: "POST",
      body,
    }),
    { params: Promise.resolve({ systemId }) },
  );
};

describe("importing a recipe from CSV", () => {
  it("refuses a technician; saves nothing and names line and column for a bad row or a mode the washer cannot run", async () => {
    await actAs(people.technician);
    expect((await upload({ code: "R-CSV-1", name: "Imported" }, RECIPE_CSV_TEMPLATE)).status).toBe(
      403,
    );
    await actAs(people.engineer);
    const before = (await t.db.select().from(recipes)).length;
    // Line 3: the wash time's setpoint outside its own validated range.
    const outside = RECIPE_CSV_TEMPLATE.replace(",300,s,240,360,", ",400,s,240,360,");
    const refused = await upload({ code: "R-CSV-1", name: "Imported recipe" }, outside);
    expect(refused.status).toBe(422);
    expect(await refused.json()).toMatchObject({
      ok: false,
      rowErrors: [{ line: 3, message: expect.stringMatching(/^setpoint: /) }],
    });
    // Line 5: the washer's rinse cannot inject.
    const noMode = RECIPE_CSV_TEMPLATE.replace(
      "Spray rinse,rinse,spray",
      "Spray rinse,rinse,injection",
    );
    const refusedMode = await upload({ code: "R-CSV-1", name: "Imported recipe" }, noMode);
    expect(await refusedMode.json()).toMatchObject({
      ok: false,
      rowErrors: [
        { line: 5, message: expect.stringMatching(/^stage_mode: Stage 2 \(Spray rinse\)/) },
      ],
    });
    const noCode = await upload({ code: "", name: "Imported recipe" }, RECIPE_CSV_TEMPLATE);
    expect(await noCode.json()).toMatchObject({
      ok: false,
      message: expect.stringMatching(/^code: /),
    });
    expect(await t.db.select().from(recipes)).toHaveLength(before);
  });

  it("creates the recipe as a draft first version through the recipe service, audited, and exports it back in the same format", async () => {
    await actAs(people.engineer);
    const res = await upload(
      { code: "R-CSV-1", name: "Imported recipe", detergent: "Alkaline cleaner", notes: "" },
      RECIPE_CSV_TEMPLATE,
    );
    const json = await res.json();
    expect(json).toMatchObject({ ok: true, recipeId: expect.any(String) });
    const [version] = await t.db
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.recipeId, json.recipeId));
    expect(version).toMatchObject({ version: 1, status: "draft", detergent: "Alkaline cleaner" });
    const snapshot = await loadRecipeSnapshot(t.db, version.id);
    expect(snapshot.stages.map((s) => s.parameters.length)).toEqual([3, 1, 1, 2]);
    expect(
      (await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, json.recipeId))).map(
        (e) => e.action,
      ),
    ).toEqual(["recipe.created"]);
    const again = await upload({ code: "R-CSV-1", name: "Twice" }, RECIPE_CSV_TEMPLATE);
    expect(again.status).not.toBe(200);

    await actAs(people.auditor);
    const exported = await exportRecipe(
      new NextRequest(`http://127.0.0.1/api/recipes/${json.recipeId}/csv?version=1`),
      { params: Promise.resolve({ recipeId: json.recipeId }) },
    );
    expect(exported.headers.get("content-type")).toMatch(/text\/csv/);
    expect((await exported.text()).replace(/^\uFEFF/, "")).toBe(recipeToCsv(snapshot));
    const missing = await exportRecipe(
      new NextRequest(`http://127.0.0.1/api/recipes/${json.recipeId}/csv?version=9`),
      { params: Promise.resolve({ recipeId: json.recipeId }) },
    );
    expect(missing.status).toBe(404);
  });
});
