import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { evidenceFiles } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { requireOpenRun } from "./guards";
import { refreshOutcome } from "./refresh-outcome";

/**
 * Detaches a file attached to an open run in error (the wrong run, a duplicate under another
 * name): it leaves the run's content and outcome, the row and the stored bytes stay, and the
 * reason is audited. A performed or verified run is corrected through a new revision instead.
 */
export async function detachEvidenceFile(
  actor: AuditActor,
  input: { runId: string; fileId: string; reason: string },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    const [file] = await tx
      .select()
      .from(evidenceFiles)
      .where(and(eq(evidenceFiles.id, input.fileId), eq(evidenceFiles.runId, run.id)));
    if (!file)
      throw new UserFacingError("This file is not attached to the run.", { kind: "not_found" });
    await tx
      .update(evidenceFiles)
      .set({
        runId: null,
        detachedFromRunId: run.id,
        detachedAt: now.toISOString(),
        detachedBy: actor.id,
        detachReason: input.reason,
      })
      .where(eq(evidenceFiles.id, file.id));
    const result = await refreshOutcome(tx, run);
    await appendAudit(tx, actor, {
      eventType: "evidence_file.detached",
      recordType: "evidence_file",
      recordId: file.id,
      old: { run: `${run.number} rev ${run.revision}`, runId: run.id },
      new: {
        reason: input.reason,
        sha256: file.sha256,
        name: file.originalName,
        outcome: result.outcome,
      },
    });
    return file;
  });
}
