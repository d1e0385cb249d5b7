import "server-only";
import { asc, desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  changeRequestEvidence,
  changeRequests,
  changeRequestTests,
  cleaningSystems,
  cleanlinessSpecs,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  testRuns,
} from "@/db/schema";

export async function listPartFamilies() {
  return getDb()
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
}

/**
 * Which recipe versions cleaned a part family, when they were in force, and the
 * test runs on the family with their computed outcomes. A version counts when it
 * was validated for the family (a requalification interval) or a run tested the
 * family on it.
 */
export async function getPartFamilyHistory(partFamilyId: string) {
  const db = getDb();
  const [head] = await db
    .select({ family: partFamilies, spec: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(eq(partFamilies.id, partFamilyId));
  if (!head) return undefined;
  const [intervals, runs] = await Promise.all([
    db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.partFamilyId, partFamilyId)),
    db
      .select()
      .from(testRuns)
      .where(eq(testRuns.partFamilyId, partFamilyId))
      .orderBy(desc(testRuns.performedOn), asc(testRuns.number)),
  ]);
  const versionIds = [
    ...new Set([...intervals.map((i) => i.recipeVersionId), ...runs.map((r) => r.recipeVersionId)]),
  ];
  if (versionIds.length === 0) return { ...head, versions: [] };
  const versions = await db
    .select({ v: recipeVersions, recipe: recipes, system: cleaningSystems })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(inArray(recipeVersions.id, versionIds));
  // A run belongs to a change request when it was tied to it on opening, or linked to one of its required tests later.
  const links = runs.length
    ? await db
        .select({
          runId: changeRequestEvidence.testRunId,
          changeRequestId: changeRequestTests.changeRequestId,
        })
        .from(changeRequestEvidence)
        .innerJoin(
          changeRequestTests,
          eq(changeRequestTests.id, changeRequestEvidence.requirementId),
        )
        .where(
          inArray(
            changeRequestEvidence.testRunId,
            runs.map((r) => r.id),
          ),
        )
    : [];
  const changeOf = (run: (typeof runs)[number]) =>
    run.changeRequestId ?? links.find((l) => l.runId === run.id)?.changeRequestId ?? null;
  const crIds = [...new Set(runs.map(changeOf).filter((x): x is string => !!x))];
  const crs = crIds.length
    ? await db
        .select({ id: changeRequests.id, number: changeRequests.number })
        .from(changeRequests)
        .where(inArray(changeRequests.id, crIds))
    : [];
  return {
    ...head,
    versions: versions
      .map(({ v, recipe, system }) => ({
        id: v.id,
        version: v.version,
        status: v.status,
        effectiveFrom: v.effectiveFrom,
        effectiveTo: v.effectiveTo,
        recipe: { id: recipe.id, code: recipe.code, name: recipe.name },
        system: { code: system.code, name: system.name },
        interval: intervals.find((i) => i.recipeVersionId === v.id) ?? null,
        runs: runs
          .filter((r) => r.recipeVersionId === v.id)
          .map((r) => ({
            ...r,
            changeNumber: crs.find((c) => c.id === changeOf(r))?.number ?? null,
          })),
      }))
      .sort(
        (a, b) =>
          (b.effectiveFrom ?? "9999").localeCompare(a.effectiveFrom ?? "9999") ||
          a.recipe.code.localeCompare(b.recipe.code),
      ),
  };
}
export type PartFamilyHistory = NonNullable<Awaited<ReturnType<typeof getPartFamilyHistory>>>;
