import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadParametersInProcessOrder } from "@/db/recipe-content";
import { cleaningSystems, documentVersions, recipes, recipeVersions, users } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { createDocument } from "@/lib/server/documents/create-document";
import { getCleaningSystem } from "@/lib/server/plant/queries";
import { listTraceableParameters } from "@/lib/server/trace/parameter-history";
import { createTestDatabase } from "./support/test-db";

// A washer runs wash, rinse, final rinse, then drying: a recipe is read in that order, never by key (which puts drying first).
const STAGE_ORDER = ["wash", "rinse", "final_rinse", "drying"];
const stageRank = (key: string) => STAGE_ORDER.indexOf(key.split(".")[0]);
// Keys of an "other" stage (loading, filtration) have no place in this list and are left out of the check.
const inProcessOrder = (all: string[]) => {
  const keys = all.filter((k) => stageRank(k) >= 0);
  return keys.length > 0 && keys.every((k, i) => i === 0 || stageRank(keys[i - 1]) <= stageRank(k));
};

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let versionId = "";
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  const [v] = await t.db
    .select({ id: recipeVersions.id })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  versionId = v.id;
});
afterAll(() => t.cleanup());

describe("parameters in process order", () => {
  it("loads a version's parameters by stage position, wash first and drying last", async () => {
    const params = await loadParametersInProcessOrder(t.db, [versionId]);
    const keys = params.map((p) => p.key);
    expect(keys[0]).toBe("wash.temperature");
    expect(params.map((p) => p.stagePosition)).toEqual(
      params.map((p) => p.stagePosition).sort((a, b) => a - b),
    );
    expect(inProcessOrder(keys)).toBe(true);
    // The alphabetical order this replaces would have put drying first: the check can fail.
    expect(inProcessOrder([...keys].sort())).toBe(false);
  });

  it("writes protocol templates with the wash parameters before the drying ones", async () => {
    const [engineer] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, "engineer@fennmoor.example"));
    const [system] = await t.db
      .select()
      .from(cleaningSystems)
      .where(eq(cleaningSystems.code, "AW-3"));
    const { versionId: docVersion } = await createDocument(
      { id: engineer.id, name: engineer.name, roles: ["engineer"] },
      {
        type: "oq_protocol",
        title: "OQ in process order",
        systemId: system.id,
        partFamilyId: null,
        recipeVersionId: versionId,
        confidencePct: 95,
        reliabilityPct: 90,
      },
    );
    const [row] = await t.db
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.id, docVersion));
    const text = JSON.stringify(row.content);
    expect(text.indexOf("Bath temperature")).toBeGreaterThan(-1);
    expect(text.indexOf("Bath temperature")).toBeLessThan(text.indexOf("Drying temperature"));
  });

  it("shows a system's effective recipes and the trace search in process order", async () => {
    const [system] = await t.db
      .select()
      .from(cleaningSystems)
      .where(eq(cleaningSystems.code, "AW-3"));
    const page = (await getCleaningSystem(system.id))!;
    for (const r of page.recipes) {
      const keys = r.effectiveVersion!.stages.flatMap((s) => s.parameters.map((p) => p.key));
      expect(inProcessOrder(keys), r.code).toBe(true);
    }
    const all = await listTraceableParameters();
    const [vb] = await t.db.select().from(recipes).where(eq(recipes.code, "R-AW3-VB"));
    expect(inProcessOrder(all.filter((p) => p.recipeId === vb.id).map((p) => p.key))).toBe(true);
  });
});
