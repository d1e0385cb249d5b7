import "server-only";
import { desc } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { signCheckpoint, type SignedCheckpoint } from "@/lib/audit/checkpoint";
import { enqueueEmail } from "@/lib/email/outbox";
import { env } from "@/lib/env";
import { checkpointName, getCheckpointStore } from "@/lib/storage/checkpoints";
import { checkpointEmail } from "@/templates/email/audit-checkpoint";
import { loadCheckpoints } from "./load-checkpoints";
import { getSigningKey } from "./signing-key";

export type CheckpointWrite =
  | { written: true; checkpoint: SignedCheckpoint; where: string; emailedTo: string | null }
  | { written: false; reason: string };

/**
 * Signs the chain's current head and stores it in the evidence store; a copy goes
 * to AUDITOR_EMAIL through the outbox. The scheduled pass (`"schedule"`) skips when
 * the newest checkpoint already holds the head, so an idle system adds none, and
 * writes no audit event (one per pass would move the head every time). A person's
 * checkpoint is recorded after it is signed, like a verification: the next
 * checkpoint then covers that event too.
 */
export async function writeCheckpoint(
  requester: AuditActor | "schedule",
  options: { now?: Date } = {},
): Promise<CheckpointWrite> {
  const by = requester === "schedule" ? "schedule" : requester.name;
  const db = getDb();
  const [head] = await db
    .select({ seq: auditEvents.seq, hash: auditEvents.hash })
    .from(auditEvents)
    .orderBy(desc(auditEvents.seq))
    .limit(1);
  if (!head)
    return {
      written: false,
      reason: "The audit trail is empty: there is nothing to checkpoint yet.",
    };
  if (requester === "schedule") {
    const { checkpoints } = await loadCheckpoints({ newestOnly: true });
    const newest = checkpoints.at(-1);
    if (newest && newest.seq === head.seq && newest.hash === head.hash)
      return { written: false, reason: "The newest checkpoint already holds the head." };
  }
  const key = getSigningKey();
  const checkpoint = signCheckpoint(head, key.privateKey, by, options.now);
  const store = getCheckpointStore();
  await store.write(
    checkpointName(checkpoint.seq, checkpoint.at),
    JSON.stringify(checkpoint, null, 2) + "\n",
  );
  const to = env().AUDITOR_EMAIL ?? null;
  if (to || requester !== "schedule") {
    await db.transaction(async (tx) => {
      const mailId = to
        ? await enqueueEmail(tx, { to, ...checkpointEmail({ checkpoint }) }, options.now)
        : null;
      if (requester !== "schedule") {
        const { seq, hash, at, keyId, signature } = checkpoint;
        await appendAudit(
          tx,
          requester,
          {
            eventType: "audit.checkpointed",
            recordType: "audit_trail",
            recordId: "chain",
            new: { seq, hash, at, keyId, signature, emailedTo: to, mailId },
          },
          options.now,
        );
      }
    });
  }
  return { written: true, checkpoint, where: store.where, emailedTo: to };
}
