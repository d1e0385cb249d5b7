import { asc, eq, inArray, sql } from "drizzle-orm";
import type { Executor, Tx } from "./client";
import { recipeParameters, recipeStages, recipeVersions } from "./schema";
import type { RecipeSnapshot } from "@/lib/changes/diff";

/**
 * A recipe version's stages and parameters as the diff compares and signatures
 * hash them: stages by position, parameters in the order they were written.
 * Used by the server and by the seed, so both hash the same content.
 */
export async function loadRecipeSnapshot(db: Executor, versionId: string): Promise<RecipeSnapshot> {
  return (await loadRecipeSnapshots(db, [versionId])).get(versionId)!;
}

/** Several versions' snapshots in three statements, whatever their number (a trace compares dozens). */
export async function loadRecipeSnapshots(
  db: Executor,
  versionIds: string[],
): Promise<Map<string, RecipeSnapshot>> {
  const ids = [...new Set(versionIds)];
  const snapshots = new Map<string, RecipeSnapshot>();
  if (ids.length === 0) return snapshots;
  // The snapshot's fields only: a trace reads the snapshots of every change it shows.
  const versions = await db
    .select({
      id: recipeVersions.id,
      detergent: recipeVersions.detergent,
      notes: recipeVersions.notes,
    })
    .from(recipeVersions)
    .where(inArray(recipeVersions.id, ids));
  const stages = await db
    .select({
      id: recipeStages.id,
      versionId: recipeStages.versionId,
      name: recipeStages.name,
      kind: recipeStages.kind,
      mode: recipeStages.mode,
    })
    .from(recipeStages)
    .where(inArray(recipeStages.versionId, ids))
    .orderBy(asc(recipeStages.position));
  const params = await db
    .select({
      stageId: recipeParameters.stageId,
      key: recipeParameters.key,
      name: recipeParameters.name,
      kind: recipeParameters.kind,
      setpoint: recipeParameters.setpoint,
      unit: recipeParameters.unit,
      validatedLow: recipeParameters.validatedLow,
      validatedHigh: recipeParameters.validatedHigh,
      critical: recipeParameters.critical,
    })
    .from(recipeParameters)
    .where(inArray(recipeParameters.versionId, ids))
    .orderBy(sql`rowid`);
  const paramsOfStage = new Map<string, typeof params>();
  for (const p of params) {
    const list = paramsOfStage.get(p.stageId);
    if (list) list.push(p);
    else paramsOfStage.set(p.stageId, [p]);
  }
  for (const id of ids) {
    const version = versions.find((v) => v.id === id);
    snapshots.set(id, {
      detergent: version?.detergent ?? null,
      notes: version?.notes ?? null,
      stages: stages
        .filter((s) => s.versionId === id)
        .map((s) => ({
          name: s.name,
          kind: s.kind,
          mode: s.mode,
          parameters: (paramsOfStage.get(s.id) ?? []).map((p) => ({
            key: p.key,
            name: p.name,
            kind: p.kind,
            setpoint: p.setpoint,
            unit: p.unit,
            validatedLow: p.validatedLow,
            validatedHigh: p.validatedHigh,
            critical: p.critical,
          })),
        })),
    });
  }
  return snapshots;
}

/**
 * The parameters of one or more recipe versions in process order: by their stage's place in the
 * sequence, then as they were written within the stage — never by key or name, which would put
 * drying before wash.
 */
export async function loadParametersInProcessOrder(db: Executor, versionIds: string[]) {
  if (versionIds.length === 0) return [];
  const rows = await db
    .select({
      p: recipeParameters,
      stageName: recipeStages.name,
      stagePosition: recipeStages.position,
    })
    .from(recipeParameters)
    .innerJoin(recipeStages, eq(recipeStages.id, recipeParameters.stageId))
    .where(inArray(recipeParameters.versionId, versionIds))
    .orderBy(
      asc(recipeParameters.versionId),
      asc(recipeStages.position),
      sql`${recipeParameters}.rowid`,
    );
  return rows.map((r) => ({ ...r.p, stageName: r.stageName, stagePosition: r.stagePosition }));
}

/** Writes a recipe version's content, replacing what a proposed version held before. */
export async function writeRecipeContent(tx: Tx, versionId: string, content: RecipeSnapshot) {
  await tx.delete(recipeParameters).where(eq(recipeParameters.versionId, versionId));
  await tx.delete(recipeStages).where(eq(recipeStages.versionId, versionId));
  await tx
    .update(recipeVersions)
    .set({ detergent: content.detergent, notes: content.notes })
    .where(eq(recipeVersions.id, versionId));
  for (const [i, s] of content.stages.entries()) {
    const [stage] = await tx
      .insert(recipeStages)
      .values({
        versionId,
        position: i + 1,
        name: s.name,
        kind: s.kind as never,
        mode: s.mode as never,
      })
      .returning();
    if (s.parameters.length)
      await tx
        .insert(recipeParameters)
        .values(s.parameters.map((p) => ({ ...p, versionId, stageId: stage.id })));
  }
}
