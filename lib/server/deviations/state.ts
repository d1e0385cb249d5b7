// Not "server-only": the demo seed runs the deviation services under tsx.
import { and, asc, count, eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  deviationLots,
  deviationParameters,
  deviationPartFamilies,
  deviations,
  partFamilies,
  recipes,
  signatures,
  users,
  type Deviation,
} from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { deviationState, expiryReason } from "@/lib/deviations/rules";
import { todayUtc } from "@/lib/format/date";
import { notFoundError } from "@/lib/server/errors";

/**
 * What the signatures bind to: everything that defines the permission (scope, values, limits,
 * justification, risk). The lot count and status move on without changing what was approved.
 */
export function deviationContentHash(
  d: Pick<
    Deviation,
    | "number"
    | "recipeId"
    | "title"
    | "justification"
    | "riskLevel"
    | "risk"
    | "endsOn"
    | "maxLots"
    | "reminderDays"
  >,
  partFamilyIds: readonly string[],
  parameters: readonly {
    key: string;
    validatedLow: number | null;
    validatedHigh: number | null;
    temporaryLow: number | null;
    temporaryHigh: number | null;
  }[],
): string {
  return sha256Hex(
    canonicalJson({
      number: d.number,
      recipeId: d.recipeId,
      title: d.title,
      justification: d.justification,
      riskLevel: d.riskLevel,
      risk: d.risk,
      endsOn: d.endsOn,
      maxLots: d.maxLots,
      reminderDays: d.reminderDays,
      partFamilyIds: [...partFamilyIds].sort(),
      parameters: [...parameters]
        .sort((a, b) => a.key.localeCompare(b.key))
        .map((p) => ({
          key: p.key,
          validatedLow: p.validatedLow,
          validatedHigh: p.validatedHigh,
          temporaryLow: p.temporaryLow,
          temporaryHigh: p.temporaryHigh,
        })),
    }),
  );
}

/** Lots recorded per deviation, in one statement. */
export async function lotsUsedOf(db: Executor, ids: readonly string[]) {
  const rows = ids.length
    ? await db
        .select({ id: deviationLots.deviationId, n: count() })
        .from(deviationLots)
        .where(inArray(deviationLots.deviationId, [...ids]))
        .groupBy(deviationLots.deviationId)
    : [];
  return new Map(rows.map((r) => [r.id, r.n]));
}

/** One deviation as the pages and every step read it, so the hash shown is the hash checked. */
export async function loadDeviation(db: Executor, deviationId: string, now = new Date()) {
  const [row] = await db
    .select({ d: deviations, recipe: recipes, author: users.name })
    .from(deviations)
    .innerJoin(recipes, eq(recipes.id, deviations.recipeId))
    .innerJoin(users, eq(users.id, deviations.createdBy))
    .where(eq(deviations.id, deviationId));
  if (!row) throw notFoundError("That deviation does not exist.");
  const families = await db
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(deviationPartFamilies)
    .innerJoin(partFamilies, eq(partFamilies.id, deviationPartFamilies.partFamilyId))
    .where(eq(deviationPartFamilies.deviationId, deviationId))
    .orderBy(asc(partFamilies.code));
  const parameters = await db
    .select()
    .from(deviationParameters)
    .where(eq(deviationParameters.deviationId, deviationId))
    .orderBy(asc(deviationParameters.key));
  const lots = await db
    .select({ lot: deviationLots.lot, recordedAt: deviationLots.recordedAt, by: users.name })
    .from(deviationLots)
    .innerJoin(users, eq(users.id, deviationLots.recordedBy))
    .where(eq(deviationLots.deviationId, deviationId))
    .orderBy(asc(deviationLots.recordedAt));
  const sigs = await db
    .select()
    .from(signatures)
    .where(and(eq(signatures.recordType, "deviation"), eq(signatures.recordId, deviationId)))
    .orderBy(asc(signatures.signedAt));
  const today = todayUtc(now);
  const contentHash = deviationContentHash(
    row.d,
    families.map((f) => f.id),
    parameters,
  );
  return {
    deviation: row.d,
    recipe: row.recipe,
    author: row.author,
    families,
    parameters,
    lots,
    lotsUsed: lots.length,
    signatures: sigs,
    contentHash,
    state: deviationState(row.d, today, lots.length),
    // Why it ended (or ends on read): the same rule the job applied.
    expiry:
      row.d.status === "approved" || row.d.status === "expired"
        ? expiryReason(row.d, today, lots.length)
        : null,
  };
}
export type DeviationView = Awaited<ReturnType<typeof loadDeviation>>;
