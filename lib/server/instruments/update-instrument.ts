import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { instrumentCalibrations, instruments } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { usesExpiry } from "@/lib/instruments/calibration";
import type { InstrumentEditInput } from "@/lib/schemas/instrument";
import {
  assertAssetNumberFree,
  assertNotRetired,
  instrumentDetails,
  loadInstrument,
} from "./shared";

/**
 * Saves an edit of a register entry, in or out of service; the audit event holds the old and new
 * value of each field that changed, and nothing is written when none did.
 */
export async function updateInstrument(
  actor: { id: string; name: string },
  input: InstrumentEditInput,
) {
  return getDb().transaction(async (tx) => {
    const before = await loadInstrument(tx, input.instrumentId);
    assertNotRetired(before);
    await assertAssetNumberFree(tx, input.assetNumber, before.id);
    const { instrumentId: _id, ...fields } = input;
    const next = {
      ...before,
      ...fields,
      statusReason: fields.status === "in_service" ? null : fields.statusReason,
    };
    // A test-ink set is usable until its expiry; anything else until its latest calibration's due date.
    const [latest] = await tx
      .select({ dueOn: instrumentCalibrations.dueOn })
      .from(instrumentCalibrations)
      .where(eq(instrumentCalibrations.instrumentId, before.id))
      .orderBy(desc(instrumentCalibrations.calibratedOn), desc(instrumentCalibrations.createdAt))
      .limit(1);
    next.dueOn = usesExpiry(next.kind) ? next.expiresOn : (latest?.dueOn ?? null);
    const old = instrumentDetails(before);
    const now = instrumentDetails(next);
    const changed = (Object.keys(now) as (keyof typeof now)[]).filter((k) => old[k] !== now[k]);
    if (changed.length === 0 && next.dueOn === before.dueOn) return { changed: [] };
    await tx
      .update(instruments)
      .set({ ...fields, statusReason: next.statusReason, dueOn: next.dueOn })
      .where(eq(instruments.id, before.id));
    await appendAudit(tx, actor, {
      eventType: "instrument.updated",
      recordType: "instrument",
      recordId: before.id,
      old: Object.fromEntries(changed.map((k) => [k, old[k]])),
      new: Object.fromEntries(changed.map((k) => [k, now[k]])),
    });
    return { changed };
  });
}
