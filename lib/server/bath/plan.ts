// Not "server-only": the demo seed reaches it through recordBathEntryIn under tsx.
import { eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { bathLimits, detergents, recipes, recipeVersions } from "@/db/schema";
import type { BathChemistryVariable, BathLimits } from "@/lib/bath/limits";

export interface PlanLine extends BathLimits {
  id: string;
  variable: BathChemistryVariable;
  recipe: string;
  recipeVersionId: string;
  recipeVersionStatus: string;
  detergent: { id: string; name: string; factorPctPerMl: number } | null;
}

/** A tank's measurement plan: one line per controlled value, with the recipe version it cites. */
export async function loadBathPlan(db: Executor, stageId: string): Promise<PlanLine[]> {
  const rows = await db
    .select({ limit: bathLimits, version: recipeVersions, recipe: recipes, detergent: detergents })
    .from(bathLimits)
    .innerJoin(recipeVersions, eq(recipeVersions.id, bathLimits.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .leftJoin(detergents, eq(detergents.id, bathLimits.detergentId))
    .where(eq(bathLimits.stageId, stageId));
  return rows.map(({ limit, version, recipe, detergent }) => ({
    id: limit.id,
    variable: limit.variable,
    target: limit.target,
    actionLow: limit.actionLow,
    actionHigh: limit.actionHigh,
    rejectLow: limit.rejectLow,
    rejectHigh: limit.rejectHigh,
    recipe: `${recipe.code} v${version.version}`,
    recipeVersionId: version.id,
    recipeVersionStatus: version.status,
    detergent: detergent
      ? { id: detergent.id, name: detergent.name, factorPctPerMl: detergent.factorPctPerMl }
      : null,
  }));
}

export function planByVariable(plan: PlanLine[]): Partial<Record<BathChemistryVariable, PlanLine>> {
  return Object.fromEntries(plan.map((l) => [l.variable, l]));
}
