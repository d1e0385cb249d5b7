import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { siteClocks, sites } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { SiteClockInput } from "@/lib/schemas/control-plan";
import { notFoundError } from "@/lib/server/errors";
import { siteClockOf } from "./site-clock";

/** Saves a site's shift starts and time zone: per-shift and daily tests follow them from now on. */
export async function saveSiteClock(
  actor: { id: string; name: string },
  input: SiteClockInput,
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const [site] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, input.siteId));
    if (!site) throw notFoundError("That site does not exist.", "siteId");
    const before = await siteClockOf(tx, site.id);
    const values = {
      timeZone: input.timeZone,
      shiftStarts: input.shiftStarts,
      updatedBy: actor.id,
      updatedAt: now.toISOString(),
    };
    await tx
      .insert(siteClocks)
      .values({ siteId: site.id, ...values })
      .onConflictDoUpdate({ target: siteClocks.siteId, set: values });
    await appendAudit(
      tx,
      actor,
      {
        eventType: "site.clock_saved",
        recordType: "site",
        recordId: site.id,
        old: before ? { timeZone: before.timeZone, shiftStarts: before.shiftStarts } : null,
        new: { timeZone: input.timeZone, shiftStarts: input.shiftStarts },
      },
      now,
    );
  });
}
