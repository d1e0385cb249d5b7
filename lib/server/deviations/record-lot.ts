// Not "server-only": the demo seed counts lots through `recordDeviationLotIn` under tsx.
import { getDb, type Tx } from "@/db/client";
import { deviationLots } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { stepProblem } from "@/lib/deviations/rules";
import { UserFacingError } from "@/lib/server/errors";
import { runDeviationJobIn } from "./run-deviation-job";
import { loadDeviation } from "./state";

/**
 * Counts one lot processed under an active deviation; the lot that uses up its limit expires it
 * in the same transaction. Wash-cycle recording can call this with its own transaction.
 */
export async function recordDeviationLotIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: { deviationId: string; lot: string },
  now = new Date(),
) {
  const view = await loadDeviation(tx, input.deviationId, now);
  const problem = stepProblem("record_lot", view.state);
  if (problem) throw new UserFacingError(problem);
  if (view.lots.some((l) => l.lot === input.lot))
    throw new UserFacingError(`Lot ${input.lot} is already counted under this deviation.`, {
      kind: "conflict",
      field: "lot",
    });
  await tx.insert(deviationLots).values({
    deviationId: view.deviation.id,
    lot: input.lot,
    recordedBy: actor.id,
    recordedAt: now.toISOString(),
  });
  await appendAudit(
    tx,
    actor,
    {
      eventType: "deviation.lot_recorded",
      recordType: "deviation",
      recordId: view.deviation.id,
      new: { lot: input.lot, lotsUsed: view.lotsUsed + 1, maxLots: view.deviation.maxLots },
    },
    now,
  );
  await runDeviationJobIn(tx, now, view.deviation.id);
  return { lotsUsed: view.lotsUsed + 1 };
}

export async function recordDeviationLot(
  actor: { id: string; name: string },
  input: { deviationId: string; lot: string },
  now = new Date(),
) {
  return getDb().transaction((tx) => recordDeviationLotIn(tx, actor, input, now));
}
