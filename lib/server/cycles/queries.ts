import "server-only";
import { and, asc, desc, eq, inArray, lt, or, type SQL } from "drizzle-orm";
import type { z } from "zod";
import { getDb } from "@/db/client";
import {
  cleaningSystems,
  partFamilies,
  recipeParameters,
  recipes,
  recipeVersions,
  washCycleLots,
  washCycles,
} from "@/db/schema";
import { BadCursorError, decodeCursor, encodeCursor } from "@/lib/api/cursor";
import { isCycleValue } from "@/lib/cycles/flag";
import type { cyclesQuery } from "@/lib/schemas/cycle";
import { loadLotHistory, searchLots } from "./lot-history";

export const lotHistory = (lot: string) => loadLotHistory(getDb(), lot);
export const findLots = (prefix: string) => searchLots(getDb(), prefix);

/** Cycles newest first, a page at a time; the cursor is the last row's start and id. */
export async function listCycles(q: z.output<typeof cyclesQuery>) {
  const db = getDb();
  let cursor: SQL | undefined;
  if (q.cursor) {
    const c = decodeCursor(q.cursor);
    if (!c) throw new BadCursorError();
    cursor = or(
      lt(washCycles.startedAt, c.key),
      and(eq(washCycles.startedAt, c.key), lt(washCycles.id, c.id)),
    );
  }
  const lotFilter = q.lot
    ? inArray(
        washCycles.id,
        db
          .select({ id: washCycleLots.cycleId })
          .from(washCycleLots)
          .where(eq(washCycleLots.lotNumber, q.lot)),
      )
    : undefined;
  const rows = await db
    .select({
      c: washCycles,
      system: cleaningSystems.code,
      recipe: recipes.code,
      version: recipeVersions.version,
      partFamily: partFamilies.code,
    })
    .from(washCycles)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, washCycles.systemId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, washCycles.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, washCycles.partFamilyId))
    .where(
      and(
        q.system ? eq(cleaningSystems.code, q.system) : undefined,
        q.flagged ? eq(washCycles.flagged, q.flagged === "true") : undefined,
        lotFilter,
        cursor,
      ),
    )
    .orderBy(desc(washCycles.startedAt), desc(washCycles.id))
    .limit(q.limit + 1);
  const data = rows.slice(0, q.limit);
  const lots = data.length
    ? await db
        .select()
        .from(washCycleLots)
        .where(
          inArray(
            washCycleLots.cycleId,
            data.map((r) => r.c.id),
          ),
        )
    : [];
  const last = data.at(-1);
  return {
    data: data.map((r) => ({
      id: r.c.id,
      cycleNumber: r.c.cycleNumber,
      system: r.system,
      recipe: r.recipe,
      version: r.version,
      partFamily: r.partFamily,
      lots: lots.filter((l) => l.cycleId === r.c.id).map((l) => l.lotNumber),
      baskets: r.c.baskets,
      startedAt: r.c.startedAt,
      endedAt: r.c.endedAt,
      operator: r.c.operator,
      values: r.c.actualValues,
      flagged: r.c.flagged,
      flagReasons: r.c.flagReasons,
      source: r.c.source,
    })),
    nextCursor: rows.length > q.limit && last ? encodeCursor(last.c.startedAt, last.c.id) : null,
  };
}
export const listCyclesApi = listCycles;

/**
 * The recipe parameters a cycle records values for, once per key (the newest name and unit), across
 * every version that has been in force: a log's value columns are mapped to these.
 */
export async function cycleValueParameters() {
  const rows = await getDb()
    .select({
      key: recipeParameters.key,
      name: recipeParameters.name,
      unit: recipeParameters.unit,
      kind: recipeParameters.kind,
    })
    .from(recipeParameters)
    .innerJoin(recipeVersions, eq(recipeVersions.id, recipeParameters.versionId))
    .where(inArray(recipeVersions.status, ["effective", "superseded"]))
    .orderBy(asc(recipeParameters.key), desc(recipeVersions.createdAt));
  const byKey = new Map<string, { key: string; name: string; unit: string }>();
  for (const r of rows) if (isCycleValue(r) && !byKey.has(r.key)) byKey.set(r.key, r);
  return [...byKey.values()];
}

/** What the hand-entry form offers: washers, their recipes, part families, and each recipe's value parameters in force. */
export async function cycleFormOptions() {
  const db = getDb();
  const systems = await db
    .select({ code: cleaningSystems.code, name: cleaningSystems.name })
    .from(cleaningSystems)
    .where(eq(cleaningSystems.active, true))
    .orderBy(asc(cleaningSystems.code));
  const recipeRows = await db
    .select({ code: recipes.code, name: recipes.name, system: cleaningSystems.code })
    .from(recipes)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .orderBy(asc(recipes.code));
  const families = await db
    .select({ code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
  return { systems, recipes: recipeRows, families };
}

/** The measured parameters of a recipe's effective version, for the form's value fields. */
export async function effectiveCycleParameters(recipeCode: string) {
  const rows = await getDb()
    .select({ p: recipeParameters })
    .from(recipeParameters)
    .innerJoin(recipeVersions, eq(recipeVersions.id, recipeParameters.versionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipes.code, recipeCode), eq(recipeVersions.status, "effective")));
  return rows.map((r) => r.p).filter(isCycleValue);
}
