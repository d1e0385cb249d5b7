// Not "server-only": a reading's or a cycle's service may call it inside its own transaction.
import { and, eq, ne } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { deviationParameters, deviations, recipeParameters, recipeVersions } from "@/db/schema";
import { judgeValue, type Judgement } from "@/lib/deviations/rules";
import { formatDate } from "@/lib/format/date";
import { lotsUsedOf } from "./state";

export interface ValueJudgement {
  judgement: Judgement;
  validated: { low: number | null; high: number | null };
  /** The deviation whose temporary range permits the value, when only a deviation does. */
  deviation: { id: string; number: string; low: number | null; high: number | null } | null;
}

/**
 * How a value recorded for a recipe parameter on a day stands: inside the effective version's
 * validated range, inside the temporary range of a deviation in force that day, or outside both.
 * A deviation in force: approved by that day, not ended before it, its last day not passed and
 * its lot limit not used up. Null when the recipe has no effective version holding the key.
 */
export async function judgeRecordedValue(
  db: Executor,
  input: { recipeId: string; key: string; value: number; on: string },
): Promise<ValueJudgement | null> {
  const [param] = await db
    .select({ low: recipeParameters.validatedLow, high: recipeParameters.validatedHigh })
    .from(recipeParameters)
    .innerJoin(recipeVersions, eq(recipeVersions.id, recipeParameters.versionId))
    .where(
      and(
        eq(recipeVersions.recipeId, input.recipeId),
        eq(recipeVersions.status, "effective"),
        eq(recipeParameters.key, input.key),
      ),
    );
  if (!param) return null;
  const candidates = await db
    .select({ d: deviations, p: deviationParameters })
    .from(deviations)
    .innerJoin(deviationParameters, eq(deviationParameters.deviationId, deviations.id))
    .where(
      and(
        eq(deviations.recipeId, input.recipeId),
        ne(deviations.status, "draft"),
        eq(deviationParameters.key, input.key),
      ),
    );
  const lots = await lotsUsedOf(
    db,
    candidates.map((c) => c.d.id),
  );
  const inForce = candidates.filter(
    ({ d }) =>
      d.approvedAt !== null &&
      formatDate(d.approvedAt) <= input.on &&
      (d.endsOn === null || input.on <= d.endsOn) &&
      (d.endedAt === null || input.on <= formatDate(d.endedAt)) &&
      // Lots beyond the limit are not permitted; the lot that reached it was.
      (d.maxLots === null || d.status !== "approved" || (lots.get(d.id) ?? 0) <= d.maxLots),
  );
  const validated = { low: param.low, high: param.high };
  for (const { d, p } of inForce) {
    const temporary = { low: p.temporaryLow, high: p.temporaryHigh };
    const judgement = judgeValue(input.value, validated, temporary);
    if (judgement === "within_temporary")
      return { judgement, validated, deviation: { id: d.id, number: d.number, ...temporary } };
  }
  return { judgement: judgeValue(input.value, validated, null), validated, deviation: null };
}
