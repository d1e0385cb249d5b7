// Not "server-only": the demo seed records cycles under tsx.
import type { Tx } from "@/db/client";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { formatDate } from "@/lib/format/date";
import { cycleLabel, raiseNonconformance } from "@/lib/server/nonconformances/raise";
import { openNcForSource } from "@/lib/server/nonconformances/shared";

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
 * trail lists every out-of-range cycle, and its nonconformance, so no flagged cycle is left without
 * an owner (a cycle already owned by one is not raised twice).
 */
export async function recordCycleFlags(tx: Tx, actor: AuditActor, flagged: FlaggedCycle[]) {
  for (const c of flagged) {
    await appendAudit(tx, actor, {
      eventType: "wash_cycle.flagged",
      recordType: "wash_cycle",
      recordId: c.id,
      new: { cycleNumber: c.cycleNumber, system: c.system, lots: c.lots, reasons: c.reasons },
    });
    if (await openNcForSource(tx, "cycle", c.id)) continue;
    const label = cycleLabel(c.system, c.cycleNumber);
    await raiseNonconformance(tx, {
      source: { kind: "cycle", id: c.id, label },
      title: `${label} outside its validated range`,
      description: c.reasons.join("; "),
      severity: "major",
      detectedOn: formatDate(c.startedAt),
      recipeId: c.recipeId,
      partFamilyId: c.partFamilyId,
      actorId: actor.id,
    });
  }
}
