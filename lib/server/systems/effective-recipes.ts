import { and, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { recipes, recipeVersions } from "@/db/schema";

/** The effective recipe versions a system runs: while there are any, its equipment is under change control. */
export async function effectiveRecipesOn(tx: Executor, systemId: string) {
  return tx
    .select({ id: recipes.id, code: recipes.code, version: recipeVersions.version })
    .from(recipes)
    .innerJoin(
      recipeVersions,
      and(eq(recipeVersions.recipeId, recipes.id), eq(recipeVersions.status, "effective")),
    )
    .where(eq(recipes.systemId, systemId))
    .orderBy(recipes.code);
}
