import "server-only";
import { and, inArray, lt } from "drizzle-orm";
import { getDb } from "@/db/client";
import { instrumentNotices, instruments } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { todayUtc } from "@/lib/format/date";
import { overdueSince, usesExpiry } from "@/lib/instruments/calibration";
import { usersWithRole } from "@/lib/server/changes/snapshot";
import { instrumentOverdueEmail } from "@/templates/email/instrument";
import { instrumentName } from "./shared";

/**
 * E-mails the lab and quality once per instrument and due date when it becomes overdue; the notice
 * row and the outbox message share a transaction, so a second pass (or server) sends nothing more.
 */
export async function sendInstrumentOverdueNotices(now = new Date()) {
  return getDb().transaction(async (tx) => {
    const overdue = await tx
      .select()
      .from(instruments)
      .where(
        and(
          inArray(instruments.status, ["in_service", "out_of_service"]),
          lt(instruments.dueOn, todayUtc(now)),
        ),
      );
    if (overdue.length === 0) return 0;
    const recipients = new Map<string, string>();
    for (const role of ["engineer", "technician"] as const)
      for (const u of await usersWithRole(tx, role)) recipients.set(u.id, u.email);
    const to = [...recipients.values()];
    let sent = 0;
    for (const row of overdue) {
      const dueOn = row.dueOn!;
      const inserted = await tx
        .insert(instrumentNotices)
        .values({ instrumentId: row.id, dueOn, createdAt: now.toISOString() })
        .onConflictDoNothing()
        .returning();
      if (inserted.length === 0) continue;
      const mail = instrumentOverdueEmail({
        name: instrumentName(row),
        assetNumber: row.assetNumber,
        dueOn,
        overdueSince: overdueSince(dueOn),
        inkSet: usesExpiry(row.kind),
        instrumentId: row.id,
      });
      for (const address of to) await enqueueEmail(tx, { to: address, ...mail }, now);
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "instrument.overdue_notice_sent",
          recordType: "instrument",
          recordId: row.id,
          new: { dueOn, to },
        },
        now,
      );
      sent++;
    }
    return sent;
  });
}
