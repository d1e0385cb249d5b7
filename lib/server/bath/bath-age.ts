import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { bathRecords } from "@/db/schema";
import { bathAgeDays } from "@/lib/bath/limits";

/**
 * Wash cycles run on a tank's bath since it was charged. Cycles are recorded by the wash-cycle
 * feature; until its count is wired in here, none are counted and the page says so (null).
 */
export async function countCyclesSinceCharge(
  _db: Executor,
  _stageId: string,
  _chargedAt: string,
): Promise<number | null> {
  return null;
}

/** How old a tank's bath is: days (and cycles, once counted) since the last dump and recharge. */
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
    cycles: chargedAt ? await countCyclesSinceCharge(db, stageId, chargedAt) : null,
  };
}
