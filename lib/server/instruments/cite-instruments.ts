import "server-only";
import { eq, inArray } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { instruments, testRunInstruments } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { INSTRUMENT_STATUS_LABELS } from "@/lib/instruments/kinds";
import { invalidError } from "@/lib/server/errors";
import { requireOpenRun } from "@/lib/server/evidence/guards";
import { citedAssetNumbers } from "./cited";
import { instrumentName } from "./shared";

/**
 * Sets the instruments an open run used. Each must be in the register and in service: a retired or
 * out-of-service instrument is refused by name. The list is part of the run's signed content.
 */
export async function citeInstrumentsIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: { runId: string; instrumentIds: string[] },
  now = new Date(),
) {
  const run = await requireOpenRun(tx, input.runId);
  const ids = [...new Set(input.instrumentIds)];
  const rows = ids.length
    ? await tx.select().from(instruments).where(inArray(instruments.id, ids))
    : [];
  if (rows.length !== ids.length)
    throw invalidError(
      "An instrument you chose is not in the register. Reload the page and choose again.",
      "instrumentIds",
    );
  const unusable = rows.filter((r) => r.status !== "in_service");
  if (unusable.length > 0)
    throw invalidError(
      `Not cited: ${unusable
        .map((r) => `${instrumentName(r)} is ${INSTRUMENT_STATUS_LABELS[r.status].toLowerCase()}`)
        .join("; ")}. Choose an instrument in service.`,
      "instrumentIds",
    );
  const before = await citedAssetNumbers(tx, run.id);
  const after = rows.map((r) => r.assetNumber).sort();
  if (before.join("\n") === after.join("\n")) return { instruments: after };
  await tx.delete(testRunInstruments).where(eq(testRunInstruments.runId, run.id));
  if (rows.length > 0)
    await tx
      .insert(testRunInstruments)
      .values(rows.map((r) => ({ runId: run.id, instrumentId: r.id })));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "test_run.instruments_cited",
      recordType: "test_run",
      recordId: run.id,
      old: { instruments: before },
      new: { instruments: after },
    },
    now,
  );
  return { instruments: after };
}

export function citeInstruments(
  actor: { id: string; name: string },
  input: { runId: string; instrumentIds: string[] },
) {
  return getDb().transaction((tx) => citeInstrumentsIn(tx, actor, input));
}
