import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { maintenanceNotices, userRoles, users } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { MAINTENANCE_LABELS } from "@/lib/evidence/maintenance";
import { maintenanceDueEmail } from "@/templates/email/maintenance-due";
import { listMaintenance } from "./queries";

/**
 * Queues one e-mail per interval, due date and level (due, then overdue) to the
 * people who keep the bath log; the notice row makes a second pass send nothing.
 */
export async function sendMaintenanceReminders(now = new Date()) {
  const pending = (await listMaintenance(now)).filter((m) => m.status.state !== "ok");
  if (pending.length === 0) return { queued: 0 };
  const db = getDb();
  const recipients = await db
    .selectDistinct({ email: users.email })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(inArray(userRoles.role, ["technician", "engineer"]), eq(users.active, true)));
  const active = recipients.map((r) => r.email);
  let queued = 0;
  for (const item of pending) {
    const level = item.status.state as "due" | "overdue";
    await db.transaction(async (tx) => {
      const inserted = await tx
        .insert(maintenanceNotices)
        .values({
          intervalId: item.intervalId,
          dueAt: item.status.dueAt,
          level,
          createdAt: now.toISOString(),
        })
        .onConflictDoNothing()
        .returning({ id: maintenanceNotices.id });
      if (inserted.length === 0) return;
      const mail = maintenanceDueEmail({
        what: MAINTENANCE_LABELS[item.kind],
        tank: item.tank,
        system: item.system,
        dueAt: item.status.dueAt,
        overdue: level === "overdue",
        stageId: item.stageId,
      });
      for (const to of active) await enqueueEmail(tx, { to, ...mail }, now);
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "maintenance_interval.reminder_queued",
          recordType: "maintenance_interval",
          recordId: item.intervalId,
          new: { level, dueAt: item.status.dueAt, recipients: active.length },
        },
        now,
      );
      queued += active.length;
    });
  }
  return { queued };
}
