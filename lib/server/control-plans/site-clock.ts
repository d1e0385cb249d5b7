// Not "server-only": the due-test computation runs in the demo seed's checks under tsx too.
import { eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { siteClocks } from "@/db/schema";
import { DEFAULT_SITE_CLOCK, type SiteClock } from "@/lib/control-plans/schedule";

/** Each site's shifts and zone, the defaults where an administrator has not saved them. */
export async function siteClocksOf(
  db: Executor,
  siteIds: readonly string[],
): Promise<Map<string, SiteClock>> {
  const rows = siteIds.length
    ? await db
        .select()
        .from(siteClocks)
        .where(inArray(siteClocks.siteId, [...siteIds]))
    : [];
  const map = new Map<string, SiteClock>();
  for (const id of siteIds) {
    const row = rows.find((r) => r.siteId === id);
    map.set(
      id,
      row ? { timeZone: row.timeZone, shiftStarts: row.shiftStarts } : DEFAULT_SITE_CLOCK,
    );
  }
  return map;
}

export async function siteClockOf(db: Executor, siteId: string) {
  const [row] = await db.select().from(siteClocks).where(eq(siteClocks.siteId, siteId));
  return row ?? null;
}
