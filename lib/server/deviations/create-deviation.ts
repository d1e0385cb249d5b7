// Not "server-only": the demo seed creates its deviations through `createDeviationIn` under tsx.
import { and, eq, inArray, like } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import {
  deviationParameters,
  deviationPartFamilies,
  deviations,
  partFamilies,
  recipeParameters,
  recipes,
  recipeVersions,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { nextDeviationNumber, temporaryRangeProblems } from "@/lib/deviations/rules";
import { todayUtc } from "@/lib/format/date";
import type { DeviationInput } from "@/lib/schemas/deviation";
import { invalidError, notFoundError, UserFacingError } from "@/lib/server/errors";
import { deviationContentHash } from "./state";

/**
 * Drafts a temporary deviation against the recipe's effective version: each parameter keeps the
 * validated range it departs from beside its temporary one. Every problem is reported by field,
 * at once, and nothing is written.
 */
export async function createDeviationIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: DeviationInput,
  now = new Date(),
) {
  const [recipe] = await tx.select().from(recipes).where(eq(recipes.id, input.recipeId));
  if (!recipe) throw notFoundError("That recipe does not exist.", "recipeId");
  const [effective] = await tx
    .select()
    .from(recipeVersions)
    .where(and(eq(recipeVersions.recipeId, recipe.id), eq(recipeVersions.status, "effective")));
  if (!effective)
    throw invalidError(
      `${recipe.code} has no effective version: a deviation departs from a validated one.`,
      "recipeId",
    );
  const inForce = await tx
    .select()
    .from(recipeParameters)
    .where(eq(recipeParameters.versionId, effective.id));
  const families = await tx
    .select({ id: partFamilies.id, code: partFamilies.code })
    .from(partFamilies)
    .where(inArray(partFamilies.id, input.partFamilyIds));

  const fieldErrors: Record<string, string[]> = {};
  const add = (field: string, message: string) => (fieldErrors[field] ??= []).push(message);
  if (input.endsOn !== null && input.endsOn < todayUtc(now))
    add("endsOn", "The end date is in the past: a deviation is planned ahead.");
  if (families.length !== new Set(input.partFamilyIds).size)
    add("partFamilyIds", "A part family chosen no longer exists.");
  const rows = input.parameters.map((p, i) => {
    const current = inForce.find((r) => r.key === p.key);
    if (!current) {
      add(
        `parameters.${i}.key`,
        `${recipe.code} version ${effective.version} has no such parameter.`,
      );
      return null;
    }
    const range = {
      validatedLow: current.validatedLow,
      validatedHigh: current.validatedHigh,
      temporaryLow: p.temporaryLow,
      temporaryHigh: p.temporaryHigh,
    };
    for (const [field, message] of Object.entries(temporaryRangeProblems(range)))
      add(`parameters.${i}.${field}`, message);
    return { key: current.key, name: current.name, unit: current.unit, ...range };
  });
  const problems = Object.keys(fieldErrors).length;
  if (problems)
    throw new UserFacingError(
      problems === 1
        ? "One value needs attention. Nothing was saved."
        : "Some values need attention. Nothing was saved.",
      { kind: "invalid", fieldErrors },
    );
  const parameters = rows.filter((r) => r !== null);

  const year = now.getUTCFullYear();
  const taken = await tx
    .select({ number: deviations.number })
    .from(deviations)
    .where(like(deviations.number, `DV-${year}-%`));
  const values = {
    number: nextDeviationNumber(
      year,
      taken.map((t) => t.number),
    ),
    recipeId: recipe.id,
    title: input.title,
    justification: input.justification,
    riskLevel: input.riskLevel,
    risk: input.risk,
    endsOn: input.endsOn,
    maxLots: input.maxLots,
    reminderDays: input.reminderDays,
  };
  const [row] = await tx
    .insert(deviations)
    .values({ ...values, status: "draft", createdBy: actor.id, createdAt: now.toISOString() })
    .returning();
  await tx
    .insert(deviationPartFamilies)
    .values(families.map((f) => ({ deviationId: row.id, partFamilyId: f.id })));
  await tx
    .insert(deviationParameters)
    .values(parameters.map((p) => ({ ...p, deviationId: row.id })));
  const contentHash = deviationContentHash(
    values,
    families.map((f) => f.id),
    parameters,
  );
  await appendAudit(
    tx,
    actor,
    {
      eventType: "deviation.created",
      recordType: "deviation",
      recordId: row.id,
      new: {
        number: row.number,
        recipe: recipe.code,
        title: row.title,
        riskLevel: row.riskLevel,
        endsOn: row.endsOn,
        maxLots: row.maxLots,
        reminderDays: row.reminderDays,
        partFamilies: families.map((f) => f.code).sort(),
        parameters: parameters.map((p) => ({
          key: p.key,
          temporaryLow: p.temporaryLow,
          temporaryHigh: p.temporaryHigh,
        })),
        contentHash,
      },
    },
    now,
  );
  return { id: row.id, number: row.number };
}

export async function createDeviation(
  actor: AuditActor & { id: string },
  input: DeviationInput,
  now = new Date(),
) {
  return getDb().transaction((tx) => createDeviationIn(tx, actor, input, now));
}
