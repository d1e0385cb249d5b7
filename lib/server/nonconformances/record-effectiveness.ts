import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { evidenceFiles, nonconformanceFiles, nonconformances, testRuns } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { loadNc } from "./shared";

/**
 * The effectiveness check's result, tied to its evidence: a verified test run, or a file
 * uploaded to the nonconformance. "Not effective" sends the NC back to its actions.
 */
export async function recordEffectivenessIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: {
    nonconformanceId: string;
    result: "confirmed" | "not_effective";
    evidenceRunNumber: string | null;
    evidenceFileId: string | null;
    note: string | null;
  },
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  if (nc.status !== "effectiveness_check")
    throw new UserFacingError(
      "Record the result once the nonconformance is at its effectiveness check.",
    );
  if (!input.evidenceRunNumber && !input.evidenceFileId)
    throw new UserFacingError(
      "Give the evidence: the number of a verified test run, or a file uploaded to this nonconformance.",
      { kind: "invalid", field: "evidenceRunNumber" },
    );
  let runId: string | null = null;
  let runLabel: string | null = null;
  if (input.evidenceRunNumber) {
    const [run] = await tx
      .select()
      .from(testRuns)
      .where(
        and(eq(testRuns.number, input.evidenceRunNumber.trim()), eq(testRuns.status, "verified")),
      );
    if (!run)
      throw new UserFacingError(`No verified test run is numbered ${input.evidenceRunNumber}.`, {
        kind: "invalid",
        field: "evidenceRunNumber",
      });
    if (input.result === "confirmed" && run.outcome !== "pass")
      throw new UserFacingError(
        `${run.number} did not pass: it cannot confirm the actions worked.`,
        {
          kind: "invalid",
          field: "evidenceRunNumber",
        },
      );
    runId = run.id;
    runLabel = run.number;
  }
  let fileSha: string | null = null;
  if (input.evidenceFileId) {
    const [file] = await tx
      .select({ sha256: evidenceFiles.sha256 })
      .from(nonconformanceFiles)
      .innerJoin(evidenceFiles, eq(evidenceFiles.id, nonconformanceFiles.fileId))
      .where(
        and(
          eq(nonconformanceFiles.nonconformanceId, nc.id),
          eq(nonconformanceFiles.fileId, input.evidenceFileId),
        ),
      );
    if (!file)
      throw new UserFacingError("That file is not uploaded to this nonconformance.", {
        kind: "invalid",
        field: "evidenceFileId",
      });
    fileSha = file.sha256;
  }
  const back = input.result === "not_effective";
  await tx
    .update(nonconformances)
    .set({
      effectivenessResult: back ? null : "confirmed",
      effectivenessRunId: back ? null : runId,
      effectivenessFileId: back ? null : input.evidenceFileId,
      effectivenessNote: input.note,
      effectivenessCheckedBy: actor.id,
      effectivenessCheckedAt: now.toISOString(),
      status: back ? "actions_under_way" : nc.status,
    })
    .where(eq(nonconformances.id, nc.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.effectiveness_recorded",
      recordType: "nonconformance",
      recordId: nc.id,
      new: { result: input.result, evidenceRun: runLabel, evidenceFile: fileSha, note: input.note },
    },
    now,
  );
  if (back)
    await appendAudit(
      tx,
      actor,
      {
        eventType: "nonconformance.status_changed",
        recordType: "nonconformance",
        recordId: nc.id,
        old: { status: nc.status },
        new: { status: "actions_under_way" },
        reason: "The effectiveness check found the actions did not work.",
      },
      now,
    );
}

export const recordEffectiveness = (
  actor: AuditActor & { id: string },
  input: Parameters<typeof recordEffectivenessIn>[2],
) => getDb().transaction((tx) => recordEffectivenessIn(tx, actor, input));
