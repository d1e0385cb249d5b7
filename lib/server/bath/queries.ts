import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  bathRecords,
  cleaningSystems,
  detergents,
  recipes,
  recipeVersions,
  maintenanceIntervals,
  systemStages,
  users,
} from "@/db/schema";
import { maintenanceStatus, type MaintenanceStatus } from "@/lib/evidence/maintenance";
import { bathAge } from "./bath-age";
import { loadBathPlan } from "./plan";

export interface MaintenanceItem {
  intervalId: string;
  stageId: string;
  tank: string;
  system: string;
  systemId: string;
  kind: (typeof maintenanceIntervals.$inferSelect)["kind"];
  intervalDays: number;
  warnDays: number;
  status: MaintenanceStatus;
}

/** Every maintenance interval with when it is next due. */
export async function listMaintenance(now = new Date()): Promise<MaintenanceItem[]> {
  const db = getDb();
  // The last record of each interval's kind in the same statement (one indexed look-up per interval), not a query per interval.
  const intervals = await db
    .select({
      interval: {
        id: maintenanceIntervals.id,
        kind: maintenanceIntervals.kind,
        intervalDays: maintenanceIntervals.intervalDays,
        warnDays: maintenanceIntervals.warnDays,
        createdAt: maintenanceIntervals.createdAt,
      },
      stage: { id: systemStages.id, name: systemStages.name },
      system: { id: cleaningSystems.id, code: cleaningSystems.code },
      lastAt: sql<
        string | null
      >`(select max(${bathRecords.performedAt}) from ${bathRecords} where ${bathRecords.stageId} = ${systemStages.id} and ${bathRecords.kind} = ${maintenanceIntervals.kind})`,
    })
    .from(maintenanceIntervals)
    .innerJoin(systemStages, eq(systemStages.id, maintenanceIntervals.stageId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
    .orderBy(asc(cleaningSystems.code), asc(systemStages.position));
  const items: MaintenanceItem[] = intervals.map(({ interval, stage, system, lastAt }) => ({
    intervalId: interval.id,
    stageId: stage.id,
    tank: stage.name,
    system: system.code,
    systemId: system.id,
    kind: interval.kind,
    intervalDays: interval.intervalDays,
    warnDays: interval.warnDays,
    status: maintenanceStatus(
      {
        intervalDays: interval.intervalDays,
        warnDays: interval.warnDays,
        lastDoneAt: lastAt ?? null,
        since: interval.createdAt,
      },
      now,
    ),
  }));
  return items;
}

/** Every system stage with its tank, for the bath log index (a stage whose tank volume is unknown is still listed). */
export async function listTanks() {
  return getDb()
    .select({ stage: systemStages, system: cleaningSystems })
    .from(systemStages)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
    .orderBy(asc(cleaningSystems.code), asc(systemStages.position));
}

export async function getTank(stageId: string, now = new Date()) {
  const db = getDb();
  const [row] = await db
    .select({ stage: systemStages, system: cleaningSystems })
    .from(systemStages)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
    .where(eq(systemStages.id, stageId));
  if (!row) return undefined;
  const records = await db
    .select({ record: bathRecords, by: users.name })
    .from(bathRecords)
    .innerJoin(users, eq(users.id, bathRecords.recordedBy))
    .where(eq(bathRecords.stageId, stageId))
    .orderBy(asc(bathRecords.performedAt));
  const maintenance = (await listMaintenance(now)).filter((m) => m.stageId === stageId);
  const [plan, age, versions] = await Promise.all([
    loadBathPlan(db, stageId),
    bathAge(db, stageId, now),
    db
      .select({ id: recipeVersions.id, code: recipes.code, version: recipeVersions.version })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(and(eq(recipes.systemId, row.system.id), eq(recipeVersions.status, "effective")))
      .orderBy(asc(recipes.code)),
  ]);
  return { ...row, records, maintenance, plan, age, effectiveVersions: versions };
}

/** The detergent register, by name. */
export async function listDetergents() {
  return getDb().select().from(detergents).orderBy(asc(detergents.name));
}

/** Each tank's latest graded reading: its state against the plan and what was beyond a limit. */
export async function latestGradedByTank() {
  const rows = await getDb()
    .select({
      stageId: bathRecords.stageId,
      performedAt: bathRecords.performedAt,
      limitState: bathRecords.limitState,
      limitFindings: bathRecords.limitFindings,
    })
    .from(bathRecords)
    .where(
      sql`${bathRecords.limitState} is not null and not exists (select 1 from bath_records later where later.stage_id = ${bathRecords.stageId} and later.limit_state is not null and later.performed_at > ${bathRecords.performedAt})`,
    );
  return new Map(rows.map((r) => [r.stageId, r]));
}
