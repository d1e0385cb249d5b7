import "server-only";
import { asc, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import type { SpecForOutcome } from "@/lib/evidence/outcome";
import {
  cleanlinessSpecs,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
} from "@/db/schema";

/** A qualified combination on an effective recipe version, with what the overview names it by. */
export interface OverviewCombination {
  systemId: string;
  recipeId: string;
  recipeCode: string;
  recipeVersionId: string;
  version: number;
  familyId: string;
  familyCode: string;
  familyName: string;
  family: { wettedAreaCm2: number; wettedVolumeCm3: number | null };
  spec: SpecForOutcome & { code: string; revision: string };
  lastQualifiedAt: string;
  intervalMonths: number;
}

/**
 * Every qualified combination on an effective version, plant-wide, in one statement: a plant
 * qualifies dozens to hundreds of them, not thousands, so the page reads them whole.
 */
export async function loadCombinations(db: Executor): Promise<OverviewCombination[]> {
  const rows = await db
    // Only the columns the page reads: a plant's hundreds of combinations, each with its spec.
    .select({
      interval: {
        lastQualifiedAt: requalificationIntervals.lastQualifiedAt,
        intervalMonths: requalificationIntervals.intervalMonths,
      },
      version: { id: recipeVersions.id, version: recipeVersions.version },
      recipe: { id: recipes.id, code: recipes.code, systemId: recipes.systemId },
      family: {
        id: partFamilies.id,
        code: partFamilies.code,
        name: partFamilies.name,
        wettedAreaCm2: partFamilies.wettedAreaCm2,
        wettedVolumeCm3: partFamilies.wettedVolumeCm3,
      },
      spec: {
        code: cleanlinessSpecs.code,
        revision: cleanlinessSpecs.revision,
        ccc: cleanlinessSpecs.ccc,
        maxMetallicUm: cleanlinessSpecs.maxMetallicUm,
        maxNonMetallicUm: cleanlinessSpecs.maxNonMetallicUm,
        maxFibreUm: cleanlinessSpecs.maxFibreUm,
        gravimetricLimitMg: cleanlinessSpecs.gravimetricLimitMg,
        gravimetricBasis: cleanlinessSpecs.gravimetricBasis,
        minWettingTensionMNm: cleanlinessSpecs.minWettingTensionMNm,
      },
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(eq(recipeVersions.status, "effective"))
    .orderBy(asc(partFamilies.code), asc(recipes.code));
  return rows.map((r) => ({
    systemId: r.recipe.systemId,
    recipeId: r.recipe.id,
    recipeCode: r.recipe.code,
    recipeVersionId: r.version.id,
    version: r.version.version,
    familyId: r.family.id,
    familyCode: r.family.code,
    familyName: r.family.name,
    family: { wettedAreaCm2: r.family.wettedAreaCm2, wettedVolumeCm3: r.family.wettedVolumeCm3 },
    spec: r.spec,
    lastQualifiedAt: r.interval.lastQualifiedAt,
    intervalMonths: r.interval.intervalMonths,
  }));
}
