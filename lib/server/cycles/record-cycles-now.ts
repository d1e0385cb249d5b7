import "server-only";
import { getDb } from "@/db/client";
import type { AuditActor } from "@/lib/audit";
import { recordCyclesIn, type RecordCycles } from "./record-cycles";

/** Records cycles in a transaction of their own: the form, the CSV import and the API call this. */
export function recordCycles(actor: AuditActor & { id: string }, input: RecordCycles) {
  return getDb().transaction((tx) => recordCyclesIn(tx, actor, input));
}
