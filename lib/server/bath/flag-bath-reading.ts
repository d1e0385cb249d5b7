// Not "server-only": the demo seed reaches it through recordBathEntryIn under tsx.
import type { Tx } from "@/db/client";
import { appendAudit } from "@/lib/audit";
import type { LimitState } from "@/lib/bath/limits";

/**
 * A bath reading beyond its reject limit raises a flagged item: the reading keeps its state and
 * findings (the queue lists it until a later reading is back within limits) and the flag is
 * audited here, in the reading's transaction. This is the one place a nonconformance for a bath
 * reading is to be opened from, with `source: { kind: "bath_reading", id: record.id }`.
 */
export async function flagBathReadingBeyondReject(
  tx: Tx,
  actor: { id: string; name: string },
  record: {
    id: string;
    tank: string;
    /** ISO time of the reading: the nonconformance's detection date. */
    performedAt: string;
    state: LimitState;
    findings: string[];
  },
) {
  await appendAudit(tx, actor, {
    eventType: "bath_record.flagged",
    recordType: "bath_record",
    recordId: record.id,
    new: { tank: record.tank, state: record.state, findings: record.findings },
  });
}
