// Not "server-only": the benchmark measures it under tsx. Pages reach it through queries.ts.
import { and, asc, desc, eq, gte, inArray, lt, or, sql } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  bathRecords,
  cleaningSystems,
  nonconformanceItems,
  nonconformances,
  partFamilies,
  recipes,
  recipeVersions,
  systemStages,
  testRuns,
  testSamples,
  washCycleLots,
  washCycles,
  type Nonconformance,
} from "@/db/schema";

type NcStatus = Nonconformance["status"];
type NcSeverity = Nonconformance["severity"];

export interface LotBathState {
  stageName: string;
  /** The last reading before the cycle started, if any. */
  reading: {
    performedAt: string;
    concentrationPct: number | null;
    conductivityUsPerCm: number | null;
    temperatureC: number | null;
  } | null;
  /** The last bath change before the cycle: the bath's age at the start follows from it. */
  lastBathChangeAt: string | null;
}

export interface LotCycle {
  id: string;
  cycleNumber: string;
  system: string;
  systemName: string;
  recipe: string;
  version: number;
  recipeVersionId: string;
  partFamily: string;
  lots: string[];
  baskets: number;
  startedAt: string;
  endedAt: string;
  operator: string;
  actualValues: Record<string, number>;
  flagged: boolean;
  flagReasons: string[];
  bath: LotBathState[];
}

export interface LotRun {
  id: string;
  number: string;
  revision: number;
  testType: string;
  status: string;
  outcome: string | null;
  performedOn: string | null;
  /** The lot's cycles its samples came out of, and how many samples from each. */
  cycles: { cycleNumber: string; samples: number }[];
}

/** A nonconformance whose containment names the lot's cycles or runs, or that one of them raised. */
export interface LotNonconformance {
  id: string;
  number: string;
  title: string;
  status: NcStatus;
  severity: NcSeverity;
  detectedOn: string;
  /** What of the lot it names: cycle and run labels as its containment lists them. */
  names: string[];
}

export interface LotHistory {
  lot: string;
  cycles: LotCycle[];
  runs: LotRun[];
  nonconformances: LotNonconformance[];
}

/** Runs with samples naming any of these cycle ids, counted per run and cycle id; read through the cycle index. */
export function runsNamingCycles(db: Executor, cycleNumbers: string[]) {
  return db
    .select({
      run: testRuns,
      systemId: recipes.systemId,
      cycleNumber: testSamples.cycleNumber,
      samples: sql<number>`count(*)`,
    })
    .from(testSamples)
    .innerJoin(testRuns, eq(testRuns.id, testSamples.runId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, testRuns.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(inArray(testSamples.cycleNumber, cycleNumbers))
    .groupBy(testRuns.id, testSamples.cycleNumber);
}

/**
 * Everything a lot went through, in a fixed number of statements whatever the plant's size: its
 * cycles (by the lot key), the bath each tank held at each cycle's start (one indexed look-back per
 * tank and cycle, inside one statement), and the test runs whose samples name those cycles.
 */
export async function loadLotHistory(db: Executor, lot: string): Promise<LotHistory> {
  const rows = await db
    .select({
      c: washCycles,
      system: cleaningSystems.code,
      systemName: cleaningSystems.name,
      recipe: recipes.code,
      version: recipeVersions.version,
      partFamily: partFamilies.code,
    })
    .from(washCycleLots)
    .innerJoin(washCycles, eq(washCycles.id, washCycleLots.cycleId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, washCycles.systemId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, washCycles.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, washCycles.partFamilyId))
    .where(eq(washCycleLots.lotNumber, lot))
    .orderBy(asc(washCycles.startedAt), asc(washCycles.cycleNumber));
  if (rows.length === 0) return { lot, cycles: [], runs: [], nonconformances: [] };
  const ids = rows.map((r) => r.c.id);
  const lotRows = await db
    .select()
    .from(washCycleLots)
    .where(inArray(washCycleLots.cycleId, ids))
    .orderBy(asc(washCycleLots.lotNumber));
  // Per cycle and tank: the newest reading and the newest bath change at or before the start.
  const latest = (kind: "reading" | "bath_change") =>
    sql<
      string | null
    >`(select ${bathRecords.id} from ${bathRecords} where ${bathRecords.stageId} = ${systemStages.id} and ${bathRecords.kind} = ${kind} and ${bathRecords.performedAt} <= ${washCycles.startedAt} order by ${bathRecords.performedAt} desc limit 1)`;
  const tankRows = await db
    .select({
      cycleId: washCycles.id,
      stageName: systemStages.name,
      position: systemStages.position,
      readingId: latest("reading"),
      changeId: latest("bath_change"),
    })
    .from(washCycles)
    .innerJoin(systemStages, eq(systemStages.systemId, washCycles.systemId))
    .where(and(inArray(washCycles.id, ids), sql`${systemStages.tankVolumeL} is not null`))
    .orderBy(asc(systemStages.position));
  const recordIds = [
    ...new Set(tankRows.flatMap((t) => [t.readingId, t.changeId]).filter((x): x is string => !!x)),
  ];
  const records = recordIds.length
    ? await db.select().from(bathRecords).where(inArray(bathRecords.id, recordIds))
    : [];
  const recordById = new Map(records.map((r) => [r.id, r]));
  // Runs whose samples name one of the cycles, on the same washer (cycle ids are unique per washer only).
  const numbers = [...new Set(rows.map((r) => r.c.cycleNumber))];
  const sampleRows = await runsNamingCycles(db, numbers);
  const onLot = new Set(rows.map((r) => `${r.c.systemId}|${r.c.cycleNumber}`));
  const runs = new Map<string, LotRun>();
  for (const s of sampleRows) {
    if (!onLot.has(`${s.systemId}|${s.cycleNumber}`)) continue;
    const run = runs.get(s.run.id) ?? {
      id: s.run.id,
      number: s.run.number,
      revision: s.run.revision,
      testType: s.run.testType,
      status: s.run.status,
      outcome: s.run.outcome,
      performedOn: s.run.performedOn,
      cycles: [],
    };
    run.cycles.push({ cycleNumber: s.cycleNumber!, samples: Number(s.samples) });
    runs.set(s.run.id, run);
  }
  const lotNcs = await lotNonconformances(db, ids, [...runs.keys()]);
  return {
    lot,
    nonconformances: lotNcs,
    cycles: rows.map((r) => ({
      id: r.c.id,
      cycleNumber: r.c.cycleNumber,
      system: r.system,
      systemName: r.systemName,
      recipe: r.recipe,
      version: r.version,
      recipeVersionId: r.c.recipeVersionId,
      partFamily: r.partFamily,
      lots: lotRows.filter((l) => l.cycleId === r.c.id).map((l) => l.lotNumber),
      baskets: r.c.baskets,
      startedAt: r.c.startedAt,
      endedAt: r.c.endedAt,
      operator: r.c.operator,
      actualValues: r.c.actualValues,
      flagged: r.c.flagged,
      flagReasons: r.c.flagReasons,
      bath: tankRows
        .filter((t) => t.cycleId === r.c.id)
        .map((t) => {
          const reading = t.readingId ? recordById.get(t.readingId) : undefined;
          const change = t.changeId ? recordById.get(t.changeId) : undefined;
          return {
            stageName: t.stageName,
            reading: reading
              ? {
                  performedAt: reading.performedAt,
                  concentrationPct: reading.concentrationPct,
                  conductivityUsPerCm: reading.conductivityUsPerCm,
                  temperatureC: reading.temperatureC,
                }
              : null,
            lastBathChangeAt: change?.performedAt ?? null,
          };
        }),
    })),
    runs: [...runs.values()].sort((a, b) =>
      a.number === b.number ? a.revision - b.revision : a.number < b.number ? -1 : 1,
    ),
  };
}

/**
 * The nonconformances that name the lot: every containment item of a cycle carries that cycle's
 * lots, so an item naming one of the lot's cycles (or runs on its parts) is one naming the lot. The
 * source counts too, for a failure raised without a containment (no part family known). One
 * statement: nonconformances are few beside cycles, and each one's items are looked up by its key.
 */
async function lotNonconformances(
  db: Executor,
  cycleIds: string[],
  runIds: string[],
): Promise<LotNonconformance[]> {
  const names = (kind: "cycle" | "run", ids: string[]) =>
    ids.length === 0
      ? []
      : [
          and(eq(nonconformanceItems.itemKind, kind), inArray(nonconformanceItems.itemId, ids)),
          and(eq(nonconformances.sourceKind, kind), inArray(nonconformances.sourceId, ids)),
        ];
  const found = await db
    .select({ nc: nonconformances, item: nonconformanceItems.label })
    .from(nonconformances)
    .leftJoin(
      nonconformanceItems,
      and(
        eq(nonconformanceItems.nonconformanceId, nonconformances.id),
        or(
          and(
            eq(nonconformanceItems.itemKind, "cycle"),
            inArray(nonconformanceItems.itemId, cycleIds),
          ),
          runIds.length
            ? and(
                eq(nonconformanceItems.itemKind, "run"),
                inArray(nonconformanceItems.itemId, runIds),
              )
            : undefined,
        ),
      ),
    )
    .where(or(...names("cycle", cycleIds), ...names("run", runIds)))
    .orderBy(asc(nonconformances.year), asc(nonconformances.sequence));
  const byId = new Map<string, LotNonconformance>();
  for (const { nc, item } of found) {
    const entry = byId.get(nc.id) ?? {
      id: nc.id,
      number: nc.number,
      title: nc.title,
      status: nc.status,
      severity: nc.severity,
      detectedOn: nc.detectedOn,
      names: [],
    };
    if (item && !entry.names.includes(item)) entry.names.push(item);
    byId.set(nc.id, entry);
  }
  return [...byId.values()].map((n) => ({ ...n, names: n.names.toSorted() }));
}

export interface LotSummary {
  lot: string;
  cycles: number;
  firstStart: string;
  lastStart: string;
  flagged: number;
}

/**
 * Lots whose number starts with `prefix` (a range of the lot key, so it stays fast at any size), or
 * the lots of the latest cycles when no prefix is given.
 */
export async function searchLots(db: Executor, prefix: string, limit = 50): Promise<LotSummary[]> {
  const summary = {
    lot: washCycleLots.lotNumber,
    cycles: sql<number>`count(*)`,
    firstStart: sql<string>`min(${washCycles.startedAt})`,
    lastStart: sql<string>`max(${washCycles.startedAt})`,
    flagged: sql<number>`sum(${washCycles.flagged})`,
  };
  if (prefix === "") {
    const recent = await db
      .select({ id: washCycles.id })
      .from(washCycles)
      .orderBy(desc(washCycles.startedAt))
      .limit(limit * 4);
    if (recent.length === 0) return [];
    const lots = await db
      .selectDistinct({ lot: washCycleLots.lotNumber })
      .from(washCycleLots)
      .where(
        inArray(
          washCycleLots.cycleId,
          recent.map((r) => r.id),
        ),
      );
    const rows = await db
      .select(summary)
      .from(washCycleLots)
      .innerJoin(washCycles, eq(washCycles.id, washCycleLots.cycleId))
      .where(
        inArray(
          washCycleLots.lotNumber,
          lots.map((l) => l.lot),
        ),
      )
      .groupBy(washCycleLots.lotNumber);
    return rows
      .map(num)
      .sort((a, b) => (a.lastStart < b.lastStart ? 1 : -1))
      .slice(0, limit);
  }
  const rows = await db
    .select(summary)
    .from(washCycleLots)
    .innerJoin(washCycles, eq(washCycles.id, washCycleLots.cycleId))
    .where(
      and(
        gte(washCycleLots.lotNumber, prefix),
        // The next string after every one that starts with the prefix.
        lt(washCycleLots.lotNumber, prefix + "\u{10FFFF}"),
      ),
    )
    .groupBy(washCycleLots.lotNumber)
    .orderBy(asc(washCycleLots.lotNumber))
    .limit(limit);
  return rows.map(num);
}

const num = (r: LotSummary): LotSummary => ({
  ...r,
  cycles: Number(r.cycles),
  flagged: Number(r.flagged),
});
