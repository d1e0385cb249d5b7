import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { requalificationIntervals } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";

/** Changes how often a validated recipe version × part family is requalified; the reason goes into the audit trail. */
export async function setRequalificationInterval(
  actor: AuditActor,
  input: { intervalId: string; intervalMonths: number; reason: string },
) {
  await getDb().transaction(async (tx) => {
    const [row] = await tx
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.id, input.intervalId));
    if (!row)
      throw new UserFacingError("That requalification interval does not exist.", {
        kind: "not_found",
      });
    if (row.intervalMonths === input.intervalMonths)
      throw new UserFacingError(
        `The interval is already ${input.intervalMonths} months.`,
        "intervalMonths",
      );
    // A new interval means a new due date, so a reminder may be due again.
    await tx
      .update(requalificationIntervals)
      .set({ intervalMonths: input.intervalMonths, notifiedForDue: null })
      .where(eq(requalificationIntervals.id, row.id));
    await appendAudit(tx, actor, {
      eventType: "requalification_interval.set",
      recordType: "requalification_interval",
      recordId: row.id,
      old: { intervalMonths: row.intervalMonths },
      new: { intervalMonths: input.intervalMonths },
      reason: input.reason,
    });
  });
}
