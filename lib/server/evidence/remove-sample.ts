import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { testSamples } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { requireOpenRun } from "./guards";
import { refreshOutcome } from "./refresh-outcome";

/** Removes a sample from an open run; the audit trail keeps what it held and why it went. */
export async function removeSample(
  actor: AuditActor,
  input: { runId: string; sampleId: string; reason: string },
) {
  if (!input.reason.trim())
    throw new UserFacingError("Give the reason for removing this sample.", {
      kind: "invalid",
      field: "reason",
    });
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    const [row] = await tx
      .select()
      .from(testSamples)
      .where(and(eq(testSamples.id, input.sampleId), eq(testSamples.runId, run.id)));
    if (!row)
      throw new UserFacingError("This sample is not part of the run.", { kind: "not_found" });
    await tx.delete(testSamples).where(eq(testSamples.id, row.id));
    const outcome = await refreshOutcome(tx, run);
    await appendAudit(tx, actor, {
      eventType: "test_run.sample_removed",
      recordType: "test_run",
      recordId: run.id,
      old: { sampleId: row.id, sampleLabel: row.sampleLabel, data: row.data },
      new: { outcome: outcome.outcome },
      reason: input.reason,
    });
  });
}
