// Not "server-only": the demo seed calls `qualifyCombinationIn` under tsx.
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { partFamilies, recipes, recipeVersions, requalificationIntervals } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { QualifyCombinationInput } from "@/lib/schemas/combination";
import { UserFacingError } from "@/lib/server/errors";

/**
 * Records a qualified combination. Only a version that has been in use can be qualified by hand:
 * a draft or proposed version is qualified by closing the change (or initial validation) that proves it.
 */
export async function qualifyCombinationIn(
  tx: Tx,
  actor: AuditActor,
  input: QualifyCombinationInput,
) {
  const [version] = await tx
    .select({ v: recipeVersions, code: recipes.code })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(eq(recipeVersions.id, input.recipeVersionId));
  if (!version)
    throw new UserFacingError("Choose the recipe version from the list.", "recipeVersionId");
  const [family] = await tx
    .select()
    .from(partFamilies)
    .where(eq(partFamilies.id, input.partFamilyId));
  if (!family) throw new UserFacingError("Choose the part family from the list.", "partFamilyId");
  const label = `${family.code} on ${version.code} v${version.v.version}`;
  if (!["effective", "superseded"].includes(version.v.status)) {
    throw new UserFacingError(
      `${version.code} v${version.v.version} is ${version.v.status}: it is qualified when the change or validation that proves it closes.`,
      "recipeVersionId",
    );
  }
  const [existing] = await tx
    .select({ id: requalificationIntervals.id })
    .from(requalificationIntervals)
    .where(
      and(
        eq(requalificationIntervals.recipeVersionId, version.v.id),
        eq(requalificationIntervals.partFamilyId, family.id),
      ),
    );
  if (existing)
    throw new UserFacingError(`${label} is already a qualified combination.`, "partFamilyId");
  const lastQualifiedAt = `${input.qualifiedOn}T00:00:00.000Z`;
  const [row] = await tx
    .insert(requalificationIntervals)
    .values({
      recipeVersionId: version.v.id,
      partFamilyId: family.id,
      intervalMonths: input.intervalMonths,
      lastQualifiedAt,
      basis: input.basis,
      qualifiedBy: actor.id,
    })
    .returning();
  await appendAudit(tx, actor, {
    eventType: "combination.qualified",
    recordType: "requalification_interval",
    recordId: row.id,
    new: {
      combination: label,
      basis: input.basis,
      qualifiedOn: input.qualifiedOn,
      intervalMonths: input.intervalMonths,
    },
  });
  return row;
}

export async function qualifyCombination(actor: AuditActor, input: QualifyCombinationInput) {
  return getDb().transaction((tx) => qualifyCombinationIn(tx, actor, input));
}
