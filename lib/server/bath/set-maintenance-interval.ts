import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { maintenanceIntervals, systemStages } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { MaintenanceIntervalInput } from "@/lib/schemas/evidence";
import { UserFacingError } from "@/lib/server/errors";

/** Sets (or changes) how often a tank's bath, filter or reading is due. */
export async function setMaintenanceInterval(
  actor: { id: string; name: string },
  input: MaintenanceIntervalInput,
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [stage] = await tx.select().from(systemStages).where(eq(systemStages.id, input.stageId));
    if (!stage) throw new UserFacingError("This tank does not exist.", { kind: "not_found" });
    const [existing] = await tx
      .select()
      .from(maintenanceIntervals)
      .where(
        and(
          eq(maintenanceIntervals.stageId, input.stageId),
          eq(maintenanceIntervals.kind, input.kind),
        ),
      );
    // Changing a due date the plant works to is a decision someone must explain; the first value is not.
    if (existing && !input.reason)
      throw new UserFacingError("Give the reason for changing this interval.", {
        kind: "invalid",
        field: "reason",
      });
    const values = { intervalDays: input.intervalDays, warnDays: input.warnDays };
    const [row] = existing
      ? await tx
          .update(maintenanceIntervals)
          .set({ ...values, updatedAt: now.toISOString() })
          .where(eq(maintenanceIntervals.id, existing.id))
          .returning()
      : await tx
          .insert(maintenanceIntervals)
          .values({
            stageId: input.stageId,
            kind: input.kind,
            ...values,
            createdBy: actor.id,
            createdAt: now.toISOString(),
          })
          .returning();
    await appendAudit(tx, actor, {
      eventType: "maintenance_interval.set",
      recordType: "maintenance_interval",
      recordId: row.id,
      old: existing ? { intervalDays: existing.intervalDays, warnDays: existing.warnDays } : null,
      new: { tank: stage.name, kind: input.kind, ...values },
      reason: input.reason ?? null,
    });
    return row;
  });
}
