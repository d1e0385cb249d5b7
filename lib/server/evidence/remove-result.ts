import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { testResults } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { requireOpenRun } from "./guards";
import { refreshOutcome } from "./refresh-outcome";

/** Removes a sample typed in error from an open run; the audit trail keeps what it held. */
export async function removeResult(actor: AuditActor, input: { runId: string; resultId: string }) {
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    const [row] = await tx.select().from(testResults).where(and(eq(testResults.id, input.resultId), eq(testResults.runId, run.id)));
    if (!row) throw new UserFacingError("This sample is not part of the run.");
    await tx.delete(testResults).where(eq(testResults.id, row.id));
    const outcome = await refreshOutcome(tx, run);
    await appendAudit(tx, actor, {
      eventType: "test_run.sample_removed",
      recordType: "test_run",
      recordId: run.id,
      old: { sampleId: row.id, sampleLabel: row.sampleLabel, data: row.data },
      new: { outcome: outcome.outcome },
    });
  });
}
