import "server-only";
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { partFamilies, recipes, recipeVersions, requalificationIntervals } from "@/db/schema";
import { dueState, requalificationDue } from "@/lib/changes/periodic";

/** Validated combinations on effective recipe versions that are overdue or fall due within 30 days. */
export async function dueRequalifications(db: Executor, now: Date) {
  const rows = await db
    .select({
      interval: requalificationIntervals,
      version: recipeVersions,
      recipe: recipes,
      family: partFamilies,
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .where(eq(recipeVersions.status, "effective"));
  return rows
    .map((r) => {
      const due = requalificationDue(r.interval.lastQualifiedAt, r.interval.intervalMonths);
      return { ...r, due, state: dueState(due, now) };
    })
    .filter((r) => r.state !== "not_due");
}
