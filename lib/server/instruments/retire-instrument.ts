import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { instruments } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { assertNotRetired, loadInstrument } from "./shared";

/** Retires an instrument for good, with the reason: it can no longer be cited or calibrated. */
export async function retireInstrument(
  actor: { id: string; name: string },
  input: { instrumentId: string; reason: string },
) {
  return getDb().transaction(async (tx) => {
    const before = await loadInstrument(tx, input.instrumentId);
    assertNotRetired(before);
    await tx
      .update(instruments)
      .set({ status: "retired", statusReason: input.reason })
      .where(eq(instruments.id, before.id));
    await appendAudit(tx, actor, {
      eventType: "instrument.retired",
      recordType: "instrument",
      recordId: before.id,
      old: { status: before.status },
      new: { status: "retired" },
      reason: input.reason,
    });
  });
}
