import "server-only";
import { and, asc, desc, eq, inArray, ne } from "drizzle-orm";
import { getDb } from "@/db/client";
import { loadParametersInProcessOrder } from "@/db/recipe-content";
import {
  deviationParameters,
  deviationPartFamilies,
  deviations,
  partFamilies,
  recipes,
  recipeVersions,
  users,
} from "@/db/schema";
import { deviationState, type DeviationState } from "@/lib/deviations/rules";
import { formatDate, todayUtc } from "@/lib/format/date";
import { lotsUsedOf } from "./state";

/** Every deviation with its state computed on read; filtered in memory (a plant holds dozens, not thousands). */
export async function listDeviations(
  filter: { state: DeviationState | "all"; recipe: string },
  now = new Date(),
) {
  const db = getDb();
  const rows = await db
    .select({ d: deviations, recipe: recipes.code, recipeName: recipes.name, author: users.name })
    .from(deviations)
    .innerJoin(recipes, eq(recipes.id, deviations.recipeId))
    .innerJoin(users, eq(users.id, deviations.createdBy))
    .orderBy(desc(deviations.number));
  const lots = await lotsUsedOf(
    db,
    rows.map((r) => r.d.id),
  );
  const today = todayUtc(now);
  return rows
    .map((r) => ({
      ...r,
      lotsUsed: lots.get(r.d.id) ?? 0,
      state: deviationState(r.d, today, lots.get(r.d.id) ?? 0),
    }))
    .filter(
      (r) =>
        (filter.state === "all" || r.state === filter.state) &&
        (filter.recipe === "" || r.recipe.toLowerCase().includes(filter.recipe.toLowerCase())),
    );
}

/** Recipes a deviation can be raised on: those with an effective version, with its parameters. */
export async function deviationFormOptions() {
  const db = getDb();
  const effective = await db
    .select({
      recipeId: recipes.id,
      code: recipes.code,
      name: recipes.name,
      versionId: recipeVersions.id,
    })
    .from(recipes)
    .innerJoin(recipeVersions, eq(recipeVersions.recipeId, recipes.id))
    .where(eq(recipeVersions.status, "effective"))
    .orderBy(asc(recipes.code));
  const params = await loadParametersInProcessOrder(
    db,
    effective.map((e) => e.versionId),
  );
  const families = await db
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
  return {
    recipes: effective.map((e) => ({
      id: e.recipeId,
      label: `${e.code} · ${e.name}`,
      parameters: params
        .filter((p) => p.versionId === e.versionId)
        .map((p) => ({
          key: p.key,
          label: `${p.name} (${p.key})`,
          unit: p.unit,
          validatedLow: p.validatedLow,
          validatedHigh: p.validatedHigh,
        })),
    })),
    families: families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` })),
  };
}

/** Deviations of one recipe that left the draft stage, newest first, with their temporary values. */
export async function deviationsOfRecipe(recipeId: string, now = new Date(), key?: string) {
  const db = getDb();
  const rows = await db
    .select()
    .from(deviations)
    .where(and(eq(deviations.recipeId, recipeId), ne(deviations.status, "draft")))
    .orderBy(desc(deviations.number));
  const ids = rows.map((r) => r.id);
  const params = ids.length
    ? await db
        .select()
        .from(deviationParameters)
        .where(inArray(deviationParameters.deviationId, ids))
        .orderBy(asc(deviationParameters.key))
    : [];
  const lots = await lotsUsedOf(db, ids);
  const today = todayUtc(now);
  return rows
    .map((d) => ({
      deviation: d,
      state: deviationState(d, today, lots.get(d.id) ?? 0),
      lotsUsed: lots.get(d.id) ?? 0,
      parameters: params.filter(
        (p) => p.deviationId === d.id && (key === undefined || p.key === key),
      ),
    }))
    .filter((d) => d.parameters.length > 0);
}
export type RecipeDeviation = Awaited<ReturnType<typeof deviationsOfRecipe>>[number];

/**
 * The approved deviations that covered a run: same recipe and part family, approved on or before
 * the day it was performed (today for an open run), and not yet ended by then.
 */
export async function deviationsCoveringRun(
  input: { recipeVersionId: string; partFamilyId: string; performedOn: string | null },
  now = new Date(),
) {
  const db = getDb();
  const [version] = await db
    .select({ recipeId: recipeVersions.recipeId })
    .from(recipeVersions)
    .where(eq(recipeVersions.id, input.recipeVersionId));
  if (!version) return [];
  const on = input.performedOn ?? todayUtc(now);
  const rows = await db
    .select({ d: deviations })
    .from(deviations)
    .innerJoin(deviationPartFamilies, eq(deviationPartFamilies.deviationId, deviations.id))
    .where(
      and(
        eq(deviations.recipeId, version.recipeId),
        eq(deviationPartFamilies.partFamilyId, input.partFamilyId),
        ne(deviations.status, "draft"),
      ),
    );
  const covering = rows
    .map((r) => r.d)
    .filter(
      (d) =>
        d.approvedAt !== null &&
        formatDate(d.approvedAt) <= on &&
        (d.endsOn === null || on <= d.endsOn) &&
        (d.endedAt === null || on <= formatDate(d.endedAt)),
    );
  const ids = covering.map((d) => d.id);
  const params = ids.length
    ? await db
        .select()
        .from(deviationParameters)
        .where(inArray(deviationParameters.deviationId, ids))
    : [];
  const lots = await lotsUsedOf(db, ids);
  return covering.map((d) => ({
    deviation: d,
    state: deviationState(d, todayUtc(now), lots.get(d.id) ?? 0),
    parameters: params.filter((p) => p.deviationId === d.id),
  }));
}
