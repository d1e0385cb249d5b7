// Not "server-only": tests and scripts run the pass directly.
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  controlPlanLines,
  controlPlanOverdueNotices,
  controlPlanVersions,
  userRoles,
  users,
} from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { CHARACTERISTIC_LABELS, frequencyWords } from "@/lib/control-plans/characteristics";
import { enqueueEmail } from "@/lib/email/outbox";
import { controlPlanOverdueEmail } from "@/templates/email/control-plan";
import { listDueControlPlanTests } from "./due-tests";

/**
 * E-mails the technicians and the plan version's author once per line and due date when a
 * routine test becomes overdue (the notice row's unique key makes a second pass send nothing).
 * Returns how many lines were notified.
 */
export async function sendControlPlanOverdueNotices(now = new Date()) {
  const overdue = await listDueControlPlanTests({ now, states: ["overdue"] });
  if (overdue.length === 0) return 0;
  let sent = 0;
  await getDb().transaction(async (tx) => {
    const technicians = await tx
      .select({ email: users.email })
      .from(users)
      .innerJoin(userRoles, eq(userRoles.userId, users.id))
      .where(and(eq(userRoles.role, "technician"), eq(users.active, true)));
    const details = await tx
      .select({
        id: controlPlanLines.id,
        reactionPlan: controlPlanLines.reactionPlan,
        author: users.email,
      })
      .from(controlPlanLines)
      .innerJoin(controlPlanVersions, eq(controlPlanVersions.id, controlPlanLines.versionId))
      .innerJoin(users, eq(users.id, controlPlanVersions.createdBy))
      .where(
        inArray(
          controlPlanLines.id,
          overdue.map((o) => o.lineId),
        ),
      );
    for (const t of overdue) {
      const dueAt = t.dueAt ?? t.overdueAt!;
      const claimed = await tx
        .insert(controlPlanOverdueNotices)
        .values({ lineId: t.lineId, dueAt, sentAt: now.toISOString() })
        .onConflictDoNothing()
        .returning({ lineId: controlPlanOverdueNotices.lineId });
      if (claimed.length === 0) continue;
      const detail = details.find((d) => d.id === t.lineId);
      const to = [
        ...new Set([...technicians.map((u) => u.email), ...(detail ? [detail.author] : [])]),
      ].sort();
      const mail = controlPlanOverdueEmail({
        characteristic: CHARACTERISTIC_LABELS[t.characteristic],
        tank: t.tank,
        combination: t.combination,
        frequency: frequencyWords(t.frequency, t.everyN),
        dueAt,
        overdueAt: t.overdueAt!,
        reactionPlan: detail?.reactionPlan ?? "",
        planId: t.controlPlanId,
      });
      for (const address of to) await enqueueEmail(tx, { to: address, ...mail }, now);
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "control_plan.overdue_notified",
          recordType: "control_plan_line",
          recordId: t.lineId,
          new: { characteristic: t.characteristic, combination: t.combination, dueAt, to },
        },
        now,
      );
      sent++;
    }
  });
  return sent;
}
