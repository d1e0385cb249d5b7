import "server-only";
import { getDb } from "@/db/client";
import { nonconformanceNotices, users } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { todayUtc } from "@/lib/format/date";
import { ncDueEmail } from "@/templates/email/nonconformance";
import { openNcWork } from "./queries";
import { reminderLevel } from "@/lib/nonconformances/reminders";

/**
 * E-mails each owner once when their nonconformance work falls due and once when it is
 * overdue (actions by their due date, the NC itself by its own, the effectiveness check by its).
 */
export async function sendNonconformanceReminders(now = new Date()) {
  const today = todayUtc(now);
  const { open, actions } = await openNcWork();
  const owners = new Map(
    (await getDb().select({ id: users.id, email: users.email }).from(users)).map((u) => [
      u.id,
      u.email,
    ]),
  );
  const byId = new Map(open.map((n) => [n.id, n]));
  const due: {
    subject: string;
    ncId: string;
    dueOn: string;
    to: string;
    what: string;
    title: string;
  }[] = [];
  for (const { action, email } of actions)
    due.push({
      subject: `action:${action.id}`,
      ncId: action.nonconformanceId,
      dueOn: action.dueOn,
      to: email,
      what: `${action.kind} action`,
      title: action.description,
    });
  for (const nc of open) {
    const to = nc.ownerId ? owners.get(nc.ownerId) : undefined;
    if (!to) continue;
    const date = nc.status === "effectiveness_check" ? nc.effectivenessDueOn : nc.dueOn;
    if (date)
      due.push({
        subject: `nc:${nc.id}`,
        ncId: nc.id,
        dueOn: date,
        to,
        what: nc.status === "effectiveness_check" ? "effectiveness check" : "nonconformance",
        title: nc.title,
      });
  }
  let sent = 0;
  await getDb().transaction(async (tx) => {
    for (const d of due) {
      const level = reminderLevel(d.dueOn, today);
      if (!level) continue;
      const inserted = await tx
        .insert(nonconformanceNotices)
        .values({ subject: d.subject, dueOn: d.dueOn, level })
        .onConflictDoNothing()
        .returning();
      if (inserted.length === 0) continue;
      const nc = byId.get(d.ncId)!;
      await enqueueEmail(
        tx,
        {
          to: d.to,
          ...ncDueEmail({
            number: nc.number,
            title: d.title,
            what: d.what,
            dueOn: d.dueOn,
            overdue: level === "overdue",
            ncId: nc.id,
          }),
        },
        now,
      );
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "nonconformance.reminder_sent",
          recordType: "nonconformance",
          recordId: nc.id,
          new: { subject: d.subject, dueOn: d.dueOn, level, to: [d.to] },
        },
        now,
      );
      sent++;
    }
  });
  return sent;
}
