import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests, emergencyChanges } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { needsEscalation } from "@/lib/changes/emergency";
import { enqueueEmail } from "@/lib/email/outbox";
import { formatDate, todayUtc } from "@/lib/format/date";
import { emergencyOverdueEmail } from "@/templates/email/emergency-change";
import { usersWithRole } from "./snapshot";

/**
 * E-mails approvers and administrators once for each emergency change whose approval is
 * overdue, and marks it escalated in the same transaction (the outbox sends after commit),
 * so a second pass — or a second server — sends nothing more.
 */
export async function escalateOverdueEmergencyApprovals(now = new Date()) {
  return getDb().transaction(async (tx) => {
    const today = todayUtc(now);
    const candidates = await tx
      .select({ e: emergencyChanges, cr: changeRequests })
      .from(emergencyChanges)
      .innerJoin(changeRequests, eq(changeRequests.id, emergencyChanges.changeRequestId))
      .where(isNull(emergencyChanges.escalatedAt));
    const overdue = candidates.filter(({ e, cr }) =>
      needsEscalation({
        status: cr.status,
        approvalDueOn: e.approvalDueOn,
        today,
        escalatedAt: e.escalatedAt,
      }),
    );
    if (overdue.length === 0) return 0;
    const recipients = new Map<string, string>();
    for (const role of ["approver", "admin"] as const)
      for (const u of await usersWithRole(tx, role)) recipients.set(u.id, u.email);
    const to = [...recipients.values()];
    for (const { e, cr } of overdue) {
      const mail = emergencyOverdueEmail({
        number: cr.number,
        title: cr.title,
        approvalDueOn: e.approvalDueOn,
        implementedOn: formatDate(e.implementedAt),
        changeRequestId: cr.id,
      });
      for (const address of to) await enqueueEmail(tx, { to: address, ...mail }, now);
      await tx
        .update(emergencyChanges)
        .set({ escalatedAt: now.toISOString() })
        .where(
          and(eq(emergencyChanges.changeRequestId, cr.id), isNull(emergencyChanges.escalatedAt)),
        );
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "change.emergency_escalated",
          recordType: "change_request",
          recordId: cr.id,
          new: { approvalDueOn: e.approvalDueOn, to },
        },
        now,
      );
    }
    return overdue.length;
  });
}
