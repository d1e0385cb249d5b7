// Not "server-only": the demo seed records cycles under tsx.
import type { Tx } from "@/db/client";
import { appendAudit, type AuditActor } from "@/lib/audit";

export interface FlaggedCycle {
  id: string;
  cycleNumber: string;
  system: string;
  lots: string[];
  reasons: string[];
  startedAt: string;
  recipeId: string;
  partFamilyId: string;
}

/**
 * What follows when a cycle left its validated range, in the transaction that recorded it: the
 * cycle row already carries the flag and its reasons; here each flag gets its own audit event, so the
 * trail lists every out-of-range cycle. This is the one place a flagged cycle leads anywhere: a
 * nonconformance is to be raised from here as well.
 */
export async function recordCycleFlags(tx: Tx, actor: AuditActor, flagged: FlaggedCycle[]) {
  for (const c of flagged) {
    await appendAudit(tx, actor, {
      eventType: "wash_cycle.flagged",
      recordType: "wash_cycle",
      recordId: c.id,
      new: { cycleNumber: c.cycleNumber, system: c.system, lots: c.lots, reasons: c.reasons },
    });
  }
}
