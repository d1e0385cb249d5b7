import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { loadParametersInProcessOrder } from "@/db/recipe-content";
import {
  cleaningSystems,
  cleanlinessSpecs,
  partFamilies,
  recipes,
  recipeStages,
  recipeVersions,
  sites,
  systemStages,
} from "@/db/schema";

export async function listCleaningSystems() {
  const db = getDb();
  const systems = await db
    .select({ system: cleaningSystems, site: sites })
    .from(cleaningSystems)
    .innerJoin(sites, eq(sites.id, cleaningSystems.siteId))
    .orderBy(asc(cleaningSystems.code));
  const stages = await db.select().from(systemStages).orderBy(asc(systemStages.position));
  const recipeRows = await db.select().from(recipes).orderBy(asc(recipes.code));
  return systems.map(({ system, site }) => ({
    ...system,
    siteName: site.name,
    stages: stages.filter((s) => s.systemId === system.id),
    recipes: recipeRows.filter((r) => r.systemId === system.id),
  }));
}

/** A system with its stages and, per recipe, the effective version's stages and parameters. */
export async function getCleaningSystem(systemId: string) {
  const db = getDb();
  const [row] = await db
    .select({ system: cleaningSystems, site: sites })
    .from(cleaningSystems)
    .innerJoin(sites, eq(sites.id, cleaningSystems.siteId))
    .where(eq(cleaningSystems.id, systemId));
  if (!row) return undefined;
  const stages = await db
    .select()
    .from(systemStages)
    .where(eq(systemStages.systemId, systemId))
    .orderBy(asc(systemStages.position));
  const recipeRows = await db
    .select()
    .from(recipes)
    .where(eq(recipes.systemId, systemId))
    .orderBy(asc(recipes.code));
  const effective = recipeRows.length
    ? await db
        .select()
        .from(recipeVersions)
        .where(
          and(
            inArray(
              recipeVersions.recipeId,
              recipeRows.map((r) => r.id),
            ),
            eq(recipeVersions.status, "effective"),
          ),
        )
    : [];
  const versionIds = effective.map((v) => v.id);
  const rStages = versionIds.length
    ? await db
        .select()
        .from(recipeStages)
        .where(inArray(recipeStages.versionId, versionIds))
        .orderBy(asc(recipeStages.position))
    : [];
  const params = await loadParametersInProcessOrder(db, versionIds);
  return {
    ...row.system,
    siteName: row.site.name,
    stages,
    recipes: recipeRows.map((recipe) => {
      const version = effective.find((v) => v.recipeId === recipe.id);
      return {
        ...recipe,
        effectiveVersion: version
          ? {
              ...version,
              stages: rStages
                .filter((s) => s.versionId === version.id)
                .map((s) => ({ ...s, parameters: params.filter((p) => p.stageId === s.id) })),
            }
          : null,
      };
    }),
  };
}

export async function listPartFamilies() {
  const db = getDb();
  return db
    .select({ family: partFamilies, spec: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .orderBy(asc(partFamilies.code));
}

export async function listSpecs() {
  return getDb().select().from(cleanlinessSpecs).orderBy(asc(cleanlinessSpecs.code));
}
