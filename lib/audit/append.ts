import { desc } from "drizzle-orm";
import { auditEvents } from "@/db/schema";
import type { Tx } from "@/db/client";
import { canonicalJson } from "./canonical-json";
import { auditEventSchema, SYSTEM_ACTOR, type AuditActor, type AuditEventInput } from "./events";
import { seedStamp } from "./seed-stamp";
import { readsBackUnchanged } from "@/lib/schemas/text";
import { chainHash, GENESIS_HASH } from "./hash";

/**
 * Appends one event to the hash chain. Call it inside the transaction that makes
 * the change it records, so both commit or neither does. SQLite serialises write
 * transactions, so reading the last hash here cannot race another writer.
 */
export async function appendAudit(
  tx: Tx,
  actor: AuditActor,
  input: AuditEventInput,
  now = new Date(),
) {
  const event = auditEventSchema.parse(input);
  // Only the demo seed sets a stamp: its story's time, and its person in place of "system".
  const stamped = seedStamp();
  if (stamped) {
    now = stamped.at;
    if (stamped.actor && actor.id === SYSTEM_ACTOR.id && actor.name === SYSTEM_ACTOR.name)
      actor = stamped.actor;
  }
  const [last] = await tx
    .select({ seq: auditEvents.seq, hash: auditEvents.hash })
    .from(auditEvents)
    .orderBy(desc(auditEvents.seq))
    .limit(1);
  const fields = {
    seq: (last?.seq ?? 0) + 1,
    at: now.toISOString(),
    actorId: actor.id,
    actorName: actor.name,
    // The stored column keeps its name: the hash of every row covers it.
    action: event.eventType,
    recordType: event.recordType,
    recordId: event.recordId,
    oldValue: event.old === null ? null : canonicalJson(event.old),
    newValue: event.new === null ? null : canonicalJson(event.new),
    reason: event.reason,
    prevHash: last?.hash ?? GENESIS_HASH,
  };
  // The hash must cover the bytes the database gives back: a NUL would be read back
  // cut short and a lone surrogate as U+FFFD, and the event would then look altered.
  for (const [name, value] of Object.entries(fields)) {
    if (typeof value === "string" && !readsBackUnchanged(value)) {
      throw new Error(
        `appendAudit: ${name} holds a NUL or a lone surrogate, which the database cannot store as given`,
      );
    }
  }
  const hash = chainHash(fields);
  await tx.insert(auditEvents).values({ ...fields, hash });
  return { seq: fields.seq, hash };
}
