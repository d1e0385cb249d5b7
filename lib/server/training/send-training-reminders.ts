import "server-only";
import { eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { trainingRecords, users } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { todayUtc } from "@/lib/format/date";
import { reminderDue, trainingState } from "@/lib/training/rules";
import { trainingDueEmail } from "@/templates/email/training";
import { dueTraining } from "./due-training";

/**
 * E-mails each person once per expiry date when a training of theirs comes within the notice
 * period (or has lapsed unreminded), and records it on the training record (`reminded_for`).
 */
export async function sendTrainingReminders(now = new Date()) {
  const today = todayUtc(now);
  const due = (await dueTraining(today)).filter(({ record }) =>
    reminderDue(record.expiresOn, record.remindedFor, today),
  );
  if (due.length === 0) return { sent: 0 };
  const db = getDb();
  const people = new Map(
    (
      await db
        .select({ id: users.id, email: users.email, active: users.active })
        .from(users)
        .where(inArray(users.id, [...new Set(due.map((d) => d.record.userId))]))
    ).map((u) => [u.id, u]),
  );
  let sent = 0;
  await db.transaction(async (tx) => {
    for (const { record, label } of due) {
      const person = people.get(record.userId);
      if (!person?.active) continue;
      await enqueueEmail(
        tx,
        {
          to: person.email,
          ...trainingDueEmail({
            subject: label,
            expiresOn: record.expiresOn,
            lapsed: trainingState(record.expiresOn, today) === "lapsed",
          }),
        },
        now,
      );
      await tx
        .update(trainingRecords)
        .set({ remindedFor: record.expiresOn })
        .where(eq(trainingRecords.id, record.id));
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "training.reminder_sent",
          recordType: "training_record",
          recordId: record.id,
          new: { subject: label, expiresOn: record.expiresOn, to: [person.email] },
        },
        now,
      );
      sent++;
    }
  });
  return { sent };
}
