import "server-only";
import { and, asc, eq, gte, inArray, lt, or } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { changeRequestEvidence, changeRequestTests, evidenceFiles, signatures, testSamples, testRuns } from "@/db/schema";

/** Every signature on a change request, over all its revisions, oldest first. */
export async function changeSignatures(db: Executor, changeRequestId: string) {
  const rows = await db
    .select()
    .from(signatures)
    // "<id>#" up to "<id>$" ("$" follows "#") is every revision, as a range the record index can seek.
    .where(and(eq(signatures.recordType, "change_request"), gte(signatures.recordId, `${changeRequestId}#`), lt(signatures.recordId, `${changeRequestId}$`)))
    .orderBy(asc(signatures.signedAt));
  return rows.map((s) => ({ ...s, revision: Number(s.recordId.split("#")[1] ?? 1) }));
}

/**
 * The test runs offered as evidence for a change request (tied to it, or linked to
 * one of its required tests), each with its sample count, signatures and files.
 */
export async function changeEvidence(db: Executor, changeRequestId: string) {
  const reqs = await db.select({ id: changeRequestTests.id }).from(changeRequestTests).where(eq(changeRequestTests.changeRequestId, changeRequestId));
  const linked = reqs.length
    ? await db.select({ runId: changeRequestEvidence.testRunId }).from(changeRequestEvidence).where(inArray(changeRequestEvidence.requirementId, reqs.map((r) => r.id)))
    : [];
  const runs = await db
    .select()
    .from(testRuns)
    .where(linked.length ? or(eq(testRuns.changeRequestId, changeRequestId), inArray(testRuns.id, linked.map((l) => l.runId))) : eq(testRuns.changeRequestId, changeRequestId))
    .orderBy(asc(testRuns.number), asc(testRuns.revision));
  const ids = runs.map((r) => r.id);
  if (ids.length === 0) return [];
  const [results, sigs, files] = await Promise.all([
    db.select({ runId: testSamples.runId, worstCase: testSamples.worstCase }).from(testSamples).where(inArray(testSamples.runId, ids)),
    db.select().from(signatures).where(and(eq(signatures.recordType, "test_run"), inArray(signatures.recordId, ids))).orderBy(asc(signatures.signedAt)),
    db.select().from(evidenceFiles).where(inArray(evidenceFiles.runId, ids)).orderBy(asc(evidenceFiles.uploadedAt)),
  ]);
  return runs.map((run) => ({
    ...run,
    samples: results.filter((r) => r.runId === run.id).length,
    worstCaseSamples: results.filter((r) => r.runId === run.id && r.worstCase).length,
    signatures: sigs.filter((s) => s.recordId === run.id),
    files: files.filter((f) => f.runId === run.id),
  }));
}
export type ChangeEvidenceRun = Awaited<ReturnType<typeof changeEvidence>>[number];
