import "server-only";
import { getDb, type Tx } from "@/db/client";
import { instruments } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { InstrumentInput } from "@/lib/schemas/instrument";
import { assertAssetNumberFree, instrumentDetails } from "./shared";

/** Adds an instrument to the register, in service; a test-ink set is usable until its expiry date. */
export async function createInstrumentIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: InstrumentInput,
  now = new Date(),
) {
  await assertAssetNumberFree(tx, input.assetNumber);
  const [row] = await tx
    .insert(instruments)
    .values({
      ...input,
      status: "in_service",
      dueOn: input.expiresOn,
      createdBy: actor.id,
      createdAt: now.toISOString(),
    })
    .returning();
  await appendAudit(
    tx,
    actor,
    {
      eventType: "instrument.created",
      recordType: "instrument",
      recordId: row.id,
      new: instrumentDetails(row),
    },
    now,
  );
  return row;
}

export function createInstrument(actor: { id: string; name: string }, input: InstrumentInput) {
  return getDb().transaction((tx) => createInstrumentIn(tx, actor, input));
}
