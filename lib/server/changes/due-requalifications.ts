import "server-only";
import { and, asc, eq, gte, lt, lte, sql, type SQL } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { partFamilies, recipes, recipeVersions, requalificationIntervals } from "@/db/schema";
import { DUE_SOON_DAYS } from "@/lib/changes/periodic";

export type RequalificationDueState = "overdue" | "due_soon";

/** The stored due date's bounds for each state at `now`: overdue before now, due soon up to 30 days on. */
function dueBounds(now: Date) {
  const nowIso = now.toISOString();
  const soonIso = new Date(now.getTime() + DUE_SOON_DAYS * 86_400_000).toISOString();
  return {
    nowIso,
    any: lte(requalificationIntervals.dueAt, soonIso),
    overdue: lt(requalificationIntervals.dueAt, nowIso),
    due_soon: and(
      gte(requalificationIntervals.dueAt, nowIso),
      lte(requalificationIntervals.dueAt, soonIso),
    ),
  };
}

const onEffectiveVersion = eq(recipeVersions.status, "effective");

/** The fields the queue and the reminders print, for the combinations `where` selects, soonest first. */
async function readDue(
  db: Executor,
  where: SQL | undefined,
  nowIso: string,
  limit = -1,
  offset = 0,
) {
  const rows = await db
    .select({
      interval: {
        id: requalificationIntervals.id,
        intervalMonths: requalificationIntervals.intervalMonths,
        lastQualifiedAt: requalificationIntervals.lastQualifiedAt,
        notifiedForDue: requalificationIntervals.notifiedForDue,
      },
      due: requalificationIntervals.dueAt,
      version: { version: recipeVersions.version },
      recipe: { id: recipes.id, code: recipes.code },
      family: { code: partFamilies.code, name: partFamilies.name },
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .where(and(onEffectiveVersion, where))
    .orderBy(asc(requalificationIntervals.dueAt), asc(requalificationIntervals.id))
    .limit(limit)
    .offset(offset);
  return rows.map((r) => {
    const due = r.due!;
    const state: RequalificationDueState = due < nowIso ? "overdue" : "due_soon";
    return { ...r, due, state };
  });
}

/** Validated combinations on effective recipe versions that are overdue or fall due within 30 days, soonest first. */
export async function dueRequalifications(db: Executor, now: Date) {
  const bounds = dueBounds(now);
  return readDue(db, bounds.any, bounds.nowIso);
}

/** How many combinations are overdue and how many fall due within 30 days. */
export async function countDueRequalifications(
  db: Executor,
  now: Date,
): Promise<Record<RequalificationDueState, number>> {
  const { nowIso, any } = dueBounds(now);
  const [row] = await db
    .select({
      overdue: sql<number>`coalesce(sum(${requalificationIntervals.dueAt} < ${nowIso}), 0)`,
      dueSoon: sql<number>`coalesce(sum(${requalificationIntervals.dueAt} >= ${nowIso}), 0)`,
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .where(and(onEffectiveVersion, any));
  return { overdue: Number(row?.overdue ?? 0), due_soon: Number(row?.dueSoon ?? 0) };
}

/** One page of the combinations in one state, soonest first. */
export async function dueRequalificationPage(
  db: Executor,
  now: Date,
  state: RequalificationDueState,
  window: { offset: number; limit: number },
) {
  const bounds = dueBounds(now);
  return readDue(db, bounds[state], bounds.nowIso, window.limit, window.offset);
}
