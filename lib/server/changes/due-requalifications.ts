import "server-only";
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { partFamilies, recipes, recipeVersions, requalificationIntervals } from "@/db/schema";
import { dueState, requalificationDue } from "@/lib/changes/periodic";

/** Validated combinations on effective recipe versions that are overdue or fall due within 30 days. */
export async function dueRequalifications(db: Executor, now: Date) {
  // The fields the queue and the reminders print: whole rows of every combination cost the
  // driver's decoding far more than the reading (500 combinations at plant size).
  const rows = await db
    .select({
      interval: {
        id: requalificationIntervals.id,
        intervalMonths: requalificationIntervals.intervalMonths,
        lastQualifiedAt: requalificationIntervals.lastQualifiedAt,
        notifiedForDue: requalificationIntervals.notifiedForDue,
      },
      version: { version: recipeVersions.version },
      recipe: { id: recipes.id, code: recipes.code },
      family: { code: partFamilies.code, name: partFamilies.name },
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
