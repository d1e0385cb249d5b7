import "server-only";
import { getDb } from "@/db/client";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { testMessageEmail } from "@/templates/email/test-message";

export async function sendTestEmail(actor: AuditActor & { id: string }, input: { to: string }) {
  await getDb().transaction(async (tx) => {
    const id = await enqueueEmail(tx, {
      to: input.to,
      ...testMessageEmail({ requestedBy: actor.name }),
    });
    await appendAudit(tx, actor, {
      eventType: "email.test_sent",
      recordType: "email",
      recordId: id,
      new: { to: input.to },
    });
  });
}
