import "server-only";
import { and, asc, count, desc, eq, gte, lte } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { bathRecords, systemStages, washCycles } from "@/db/schema";
import { bathAgeDays } from "@/lib/bath/limits";

/**
 * Wash cycles run on a tank's bath since it was charged: the cycles of the washer the tank belongs
 * to (every cycle of a washer passes through each of its tanks) started from the charge up to `until`.
 */
export async function countCyclesSinceCharge(
  db: Executor,
  stageId: string,
  chargedAt: string,
  until = new Date(),
): Promise<number> {
  const [row] = await db
    .select({ cycles: count() })
    .from(washCycles)
    .innerJoin(systemStages, eq(systemStages.systemId, washCycles.systemId))
    .where(
      and(
        eq(systemStages.id, stageId),
        gte(washCycles.startedAt, chargedAt),
        lte(washCycles.startedAt, until.toISOString()),
      ),
    );
  return row?.cycles ?? 0;
}

/** How old a tank's bath is: days and wash cycles since the last dump and recharge. */
export async function bathAge(db: Executor, stageId: string, now = new Date()) {
  const [lastCharge] = await db
    .select({ at: bathRecords.performedAt })
    .from(bathRecords)
    .where(and(eq(bathRecords.stageId, stageId), eq(bathRecords.kind, "bath_change")))
    .orderBy(desc(bathRecords.performedAt))
    .limit(1);
  // Never recharged in the log: the bath is at least as old as the first entry.
  const [first] = lastCharge
    ? [undefined]
    : await db
        .select({ at: bathRecords.performedAt })
        .from(bathRecords)
        .where(eq(bathRecords.stageId, stageId))
        .orderBy(asc(bathRecords.performedAt))
        .limit(1);
  const chargedAt = lastCharge?.at ?? first?.at ?? null;
  return {
    chargedAt,
    recharged: Boolean(lastCharge),
    days: bathAgeDays(chargedAt, now),
    cycles: chargedAt ? await countCyclesSinceCharge(db, stageId, chargedAt, now) : null,
  };
}
