// Not "server-only": the demo seed and the benchmark read the due tests under tsx.
import { and, asc, desc, eq, gt, inArray, isNotNull, lte, min, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import {
  bathRecords,
  cleaningSystems,
  controlPlanLines,
  controlPlans,
  controlPlanVersions,
  partFamilies,
  recipes,
  recipeVersions,
  systemStages,
  testRuns,
  testSamples,
  washCycleLots,
  washCycles,
} from "@/db/schema";
import {
  CHARACTERISTIC_BATH_VALUE,
  CHARACTERISTIC_TEST_TYPE,
  isBathCharacteristic,
  type Characteristic,
  type DueState,
  type Frequency,
} from "@/lib/control-plans/characteristics";
import { scheduleLine } from "@/lib/control-plans/schedule";
import type { TestType } from "@/lib/recipes/test-types";
import { combinationName } from "./state";
import { siteClocksOf } from "./site-clock";

export interface DueControlPlanTest {
  controlPlanId: string;
  versionId: string;
  lineId: string;
  systemId: string;
  recipeVersionId: string;
  partFamilyId: string;
  characteristic: Characteristic;
  /** When the next test became (or becomes) due; null while its cycle or lot count is not reached. */
  dueAt: string | null;
  /** When it becomes overdue (one more interval of grace). */
  overdueAt: string | null;
  state: DueState;
  // What a screen shows beside it.
  combination: string;
  systemCode: string;
  testType: TestType | null;
  stageId: string | null;
  tank: string | null;
  method: string;
  sampleSize: number;
  minCycles: number | null;
  frequency: Frequency;
  everyN: number | null;
  lastDoneAt: string | null;
}

const BATH_COLUMNS = {
  concentrationPct: bathRecords.concentrationPct,
  ph: bathRecords.ph,
  temperatureC: bathRecords.temperatureC,
  oilContentGPerL: bathRecords.oilContentGPerL,
} as const;

/**
 * Every line of every effective control plan (on a recipe version still in force), with when its
 * next test is due and whether it is due or overdue now. The last satisfying record is a verified
 * run of the line's test type on the combination (counted from when it was opened, when its parts
 * were sampled), or a reading of the line's value on its tank; the cycles and lots counted are the
 * combination's since then. Filter by washer, plan or state.
 */
export async function listDueControlPlanTests(
  options: {
    now?: Date;
    systemId?: string;
    controlPlanId?: string;
    states?: readonly DueState[];
    db?: Executor;
  } = {},
): Promise<DueControlPlanTest[]> {
  const db = options.db ?? getDb();
  const now = options.now ?? new Date();
  const nowIso = now.toISOString();
  const where = [
    eq(controlPlanVersions.status, "effective"),
    eq(recipeVersions.status, "effective"),
  ];
  if (options.systemId) where.push(eq(recipes.systemId, options.systemId));
  if (options.controlPlanId) where.push(eq(controlPlans.id, options.controlPlanId));
  const plans = await db
    .select({
      planId: controlPlans.id,
      versionId: controlPlanVersions.id,
      effectiveAt: controlPlanVersions.effectiveAt,
      createdAt: controlPlanVersions.createdAt,
      recipeVersionId: controlPlans.recipeVersionId,
      partFamilyId: controlPlans.partFamilyId,
      recipeCode: recipes.code,
      version: recipeVersions.version,
      familyCode: partFamilies.code,
      systemId: cleaningSystems.id,
      systemCode: cleaningSystems.code,
      siteId: cleaningSystems.siteId,
    })
    .from(controlPlanVersions)
    .innerJoin(controlPlans, eq(controlPlans.id, controlPlanVersions.planId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, controlPlans.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .innerJoin(partFamilies, eq(partFamilies.id, controlPlans.partFamilyId))
    .where(and(...where));
  if (plans.length === 0) return [];
  const lines = await db
    .select({ line: controlPlanLines, tank: systemStages.name })
    .from(controlPlanLines)
    .leftJoin(systemStages, eq(systemStages.id, controlPlanLines.stageId))
    .where(
      inArray(
        controlPlanLines.versionId,
        plans.map((p) => p.versionId),
      ),
    )
    .orderBy(asc(controlPlanLines.position));
  const clocks = await siteClocksOf(db, [...new Set(plans.map((p) => p.siteId))]);

  const rows: DueControlPlanTest[] = [];
  for (const plan of plans) {
    const effectiveFrom = plan.effectiveAt ?? plan.createdAt;
    for (const { line, tank } of lines.filter((l) => l.line.versionId === plan.versionId)) {
      const testType = CHARACTERISTIC_TEST_TYPE[line.characteristic] ?? null;
      let lastDoneAt: string | null = null;
      if (isBathCharacteristic(line.characteristic) && line.stageId) {
        const column = BATH_COLUMNS[CHARACTERISTIC_BATH_VALUE[line.characteristic]];
        const [reading] = await db
          .select({ at: bathRecords.performedAt })
          .from(bathRecords)
          .where(
            and(
              eq(bathRecords.stageId, line.stageId),
              eq(bathRecords.kind, "reading"),
              isNotNull(column),
              lte(bathRecords.performedAt, nowIso),
            ),
          )
          .orderBy(desc(bathRecords.performedAt))
          .limit(1);
        lastDoneAt = reading?.at ?? null;
      } else if (testType) {
        const [run] = await db
          .select({ at: testRuns.createdAt })
          .from(testRuns)
          .where(
            and(
              eq(testRuns.recipeVersionId, plan.recipeVersionId),
              eq(testRuns.partFamilyId, plan.partFamilyId),
              eq(testRuns.testType, testType),
              eq(testRuns.status, "verified"),
              lte(testRuns.createdAt, nowIso),
              // Parts from one basket are not independent samples: a run satisfies the line only
              // when its samples came out of at least the line's number of distinct cycles.
              line.minCycles && line.minCycles > 1
                ? sql`(select count(distinct ${testSamples.cycleNumber}) from ${testSamples} where ${testSamples.runId} = ${testRuns.id}) >= ${line.minCycles}`
                : undefined,
            ),
          )
          .orderBy(desc(testRuns.createdAt))
          .limit(1);
        lastDoneAt = run?.at ?? null;
      }
      const reference = lastDoneAt && lastDoneAt > effectiveFrom ? lastDoneAt : effectiveFrom;
      const onCombination = and(
        eq(washCycles.recipeVersionId, plan.recipeVersionId),
        eq(washCycles.partFamilyId, plan.partFamilyId),
        gt(washCycles.startedAt, reference),
        lte(washCycles.startedAt, nowIso),
      );
      let cycleStarts: string[] = [];
      let newLotStarts: string[] = [];
      if (line.frequency === "every_n_cycles") {
        cycleStarts = (
          await db
            .select({ at: washCycles.startedAt })
            .from(washCycles)
            .where(onCombination)
            .orderBy(asc(washCycles.startedAt))
            .limit(2 * (line.everyN ?? 1))
        ).map((c) => c.at);
      } else if (line.frequency === "per_lot") {
        const first = min(washCycles.startedAt);
        newLotStarts = (
          await db
            .select({ at: first })
            .from(washCycleLots)
            .innerJoin(washCycles, eq(washCycles.id, washCycleLots.cycleId))
            .where(onCombination)
            .groupBy(washCycleLots.lotNumber)
            .orderBy(sql`1`)
            .limit(2)
        ).flatMap((l) => (l.at ? [l.at] : []));
      }
      const schedule = scheduleLine({
        frequency: line.frequency,
        everyN: line.everyN,
        effectiveFrom,
        lastDoneAt,
        cycleStarts,
        newLotStarts,
        now,
        clock: clocks.get(plan.siteId)!,
      });
      if (options.states && !options.states.includes(schedule.state)) continue;
      rows.push({
        controlPlanId: plan.planId,
        versionId: plan.versionId,
        lineId: line.id,
        systemId: plan.systemId,
        recipeVersionId: plan.recipeVersionId,
        partFamilyId: plan.partFamilyId,
        characteristic: line.characteristic,
        ...schedule,
        combination: combinationName(plan.recipeCode, plan.version, plan.familyCode),
        systemCode: plan.systemCode,
        testType,
        stageId: line.stageId,
        tank,
        method: line.method,
        sampleSize: line.sampleSize,
        minCycles: line.minCycles,
        frequency: line.frequency,
        everyN: line.everyN,
        lastDoneAt,
      });
    }
  }
  return rows.sort((a, b) => (a.overdueAt ?? "9999").localeCompare(b.overdueAt ?? "9999"));
}
