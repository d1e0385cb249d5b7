// Not "server-only": the demo seed calls `setBathLimitIn` under tsx.
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import {
  bathLimits,
  detergents,
  recipeParameters,
  recipeStages,
  recipes,
  recipeVersions,
  systemStages,
} from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { BATH_CHEMISTRY, type BathChemistryVariable } from "@/lib/bath/limits";
import type { BathLimitInput } from "@/lib/schemas/bath-plan";
import { UserFacingError } from "@/lib/server/errors";

/** The recipe parameter kind whose validated range bounds a plan line, where the recipe has one. */
const RECIPE_KIND: Partial<
  Record<BathChemistryVariable, { kind: "concentration" | "temperature"; unit: string }>
> = {
  concentrationPct: { kind: "concentration", unit: "%" },
  temperatureC: { kind: "temperature", unit: "°C" },
};

/**
 * Sets one line of a tank's measurement plan from the recipe version in force on its washer. Where
 * that version validated a range for the value (concentration, temperature), the reject limits
 * default to it and may not lie outside it: a bath beyond the proven range is not a validated bath.
 */
export async function setBathLimit(
  actor: { id: string; name: string },
  input: BathLimitInput,
  now = new Date(),
) {
  return getDb().transaction((tx) => setBathLimitIn(tx, actor, input, now));
}

export async function setBathLimitIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: BathLimitInput,
  now = new Date(),
) {
  const [stage] = await tx.select().from(systemStages).where(eq(systemStages.id, input.stageId));
  if (!stage) throw new UserFacingError("This tank does not exist.", { kind: "not_found" });
  const [version] = await tx
    .select({ version: recipeVersions, recipe: recipes })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(eq(recipeVersions.id, input.recipeVersionId));
  if (!version || version.recipe.systemId !== stage.systemId)
    throw new UserFacingError("Choose a recipe of this tank's washer.", {
      kind: "invalid",
      field: "recipeVersionId",
    });
  if (version.version.status !== "effective")
    throw new UserFacingError(
      `${version.recipe.code} version ${version.version.version} is not in force: limits are taken from the effective version.`,
      { kind: "invalid", field: "recipeVersionId" },
    );
  let detergentName: string | null = null;
  if (input.detergentId) {
    const [d] = await tx.select().from(detergents).where(eq(detergents.id, input.detergentId));
    if (!d)
      throw new UserFacingError("Choose the detergent from the list.", {
        kind: "invalid",
        field: "detergentId",
      });
    detergentName = d.name;
  }
  const limits = {
    target: input.target ?? null,
    actionLow: input.actionLow ?? null,
    actionHigh: input.actionHigh ?? null,
    rejectLow: input.rejectLow ?? null,
    rejectHigh: input.rejectHigh ?? null,
  };
  const bound = RECIPE_KIND[input.variable];
  if (bound) {
    const params = await tx
      .select({ parameter: recipeParameters, stageKind: recipeStages.kind })
      .from(recipeParameters)
      .innerJoin(recipeStages, eq(recipeStages.id, recipeParameters.stageId))
      .where(
        and(
          eq(recipeParameters.versionId, input.recipeVersionId),
          eq(recipeParameters.kind, bound.kind),
          eq(recipeParameters.unit, bound.unit),
        ),
      )
      .orderBy(recipeStages.position);
    const bounded = params.filter(
      (x) => x.parameter.validatedLow !== null || x.parameter.validatedHigh !== null,
    );
    // A washer's wash and rinse stages each have a temperature: the tank's own stage bounds its line.
    const p = (bounded.find((x) => x.stageKind === stage.kind) ?? bounded[0])?.parameter;
    if (p) {
      limits.rejectLow ??= p.validatedLow;
      limits.rejectHigh ??= p.validatedHigh;
      limits.target ??= p.setpoint;
      const unit = BATH_CHEMISTRY[input.variable].unit;
      if (p.validatedLow !== null && limits.rejectLow !== null && limits.rejectLow < p.validatedLow)
        throw new UserFacingError(
          `The recipe validated ${p.name} from ${p.validatedLow} ${unit}: the lower reject limit may not be below it.`,
          { kind: "invalid", field: "rejectLow" },
        );
      if (
        p.validatedHigh !== null &&
        limits.rejectHigh !== null &&
        limits.rejectHigh > p.validatedHigh
      )
        throw new UserFacingError(
          `The recipe validated ${p.name} up to ${p.validatedHigh} ${unit}: the upper reject limit may not be above it.`,
          { kind: "invalid", field: "rejectHigh" },
        );
    }
  }
  const [existing] = await tx
    .select()
    .from(bathLimits)
    .where(and(eq(bathLimits.stageId, input.stageId), eq(bathLimits.variable, input.variable)));
  const values = {
    recipeVersionId: input.recipeVersionId,
    detergentId: input.detergentId ?? null,
    ...limits,
  };
  const [row] = existing
    ? await tx
        .update(bathLimits)
        .set({ ...values, updatedAt: now.toISOString() })
        .where(eq(bathLimits.id, existing.id))
        .returning()
    : await tx
        .insert(bathLimits)
        .values({
          stageId: input.stageId,
          variable: input.variable,
          ...values,
          createdBy: actor.id,
          createdAt: now.toISOString(),
        })
        .returning();
  await appendAudit(tx, actor, {
    eventType: "bath_limit.set",
    recordType: "bath_limit",
    recordId: row.id,
    old: existing
      ? {
          recipeVersionId: existing.recipeVersionId,
          target: existing.target,
          actionLow: existing.actionLow,
          actionHigh: existing.actionHigh,
          rejectLow: existing.rejectLow,
          rejectHigh: existing.rejectHigh,
        }
      : null,
    new: {
      tank: stage.name,
      variable: input.variable,
      recipe: `${version.recipe.code} v${version.version.version}`,
      recipeVersionId: input.recipeVersionId,
      detergent: detergentName,
      ...limits,
    },
  });
  return row;
}
