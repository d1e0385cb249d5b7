import "server-only";
import { and, asc, eq, gte, inArray, lt, or } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  changeRequestEvidence,
  changeRequestTests,
  evidenceFiles,
  signatures,
  testSamples,
  testRuns,
} from "@/db/schema";

/** Every signature on a change request, over all its revisions, oldest first. */
export async function changeSignatures(db: Executor, changeRequestId: string) {
  return (await changeSignaturesOf(db, [changeRequestId])).get(changeRequestId)!;
}

/** changeSignatures for several change requests in one statement, keyed by change request. */
export async function changeSignaturesOf(db: Executor, changeRequestIds: string[]) {
  const ids = [...new Set(changeRequestIds)];
  const rows = ids.length
    ? await db
        .select()
        .from(signatures)
        // "<id>#" up to "<id>$" ("$" follows "#") is every revision, as a range the record index can seek.
        .where(
          and(
            eq(signatures.recordType, "change_request"),
            or(
              ...ids.map((id) =>
                and(gte(signatures.recordId, `${id}#`), lt(signatures.recordId, `${id}$`)),
              ),
            ),
          ),
        )
        .orderBy(asc(signatures.signedAt))
    : [];
  const byChange = new Map(
    ids.map((id) => [id, [] as ((typeof rows)[number] & { revision: number })[]]),
  );
  for (const s of rows)
    byChange
      .get(s.recordId.split("#")[0])
      ?.push({ ...s, revision: Number(s.recordId.split("#")[1] ?? 1) });
  return byChange;
}

/**
 * The test runs offered as evidence for a change request (tied to it, or linked to
 * one of its required tests), each with its sample count, signatures and files.
 */
export async function changeEvidence(db: Executor, changeRequestId: string) {
  return (await changeEvidenceOf(db, [changeRequestId])).get(changeRequestId)!;
}

/** changeEvidence for several change requests in at most six statements, keyed by change request. */
export async function changeEvidenceOf(db: Executor, changeRequestIds: string[]) {
  const ids = [...new Set(changeRequestIds)];
  const reqs = ids.length
    ? await db
        .select({ id: changeRequestTests.id, changeRequestId: changeRequestTests.changeRequestId })
        .from(changeRequestTests)
        .where(inArray(changeRequestTests.changeRequestId, ids))
    : [];
  const linked = reqs.length
    ? await db
        .select({
          runId: changeRequestEvidence.testRunId,
          requirementId: changeRequestEvidence.requirementId,
        })
        .from(changeRequestEvidence)
        .where(
          inArray(
            changeRequestEvidence.requirementId,
            reqs.map((r) => r.id),
          ),
        )
    : [];
  const runs = ids.length
    ? await db
        .select()
        .from(testRuns)
        .where(
          linked.length
            ? or(
                inArray(testRuns.changeRequestId, ids),
                inArray(
                  testRuns.id,
                  linked.map((l) => l.runId),
                ),
              )
            : inArray(testRuns.changeRequestId, ids),
        )
        .orderBy(asc(testRuns.number), asc(testRuns.revision))
    : [];
  const runIds = runs.map((r) => r.id);
  // Sequential awaits: the executor may be a transaction, which runs one statement at a time.
  const results = runIds.length
    ? await db
        .select({ runId: testSamples.runId, worstCase: testSamples.worstCase })
        .from(testSamples)
        .where(inArray(testSamples.runId, runIds))
    : [];
  const sigs = runIds.length
    ? await db
        .select()
        .from(signatures)
        .where(and(eq(signatures.recordType, "test_run"), inArray(signatures.recordId, runIds)))
        .orderBy(asc(signatures.signedAt))
    : [];
  const files = runIds.length
    ? await db
        .select()
        .from(evidenceFiles)
        .where(inArray(evidenceFiles.runId, runIds))
        .orderBy(asc(evidenceFiles.uploadedAt))
    : [];
  const changeOfRequirement = new Map(reqs.map((r) => [r.id, r.changeRequestId]));
  const evidence = runs.map((run) => ({
    ...run,
    samples: results.filter((r) => r.runId === run.id).length,
    worstCaseSamples: results.filter((r) => r.runId === run.id && r.worstCase).length,
    signatures: sigs.filter((s) => s.recordId === run.id),
    files: files.filter((f) => f.runId === run.id),
  }));
  return new Map(
    ids.map((id) => {
      const linkedHere = new Set(
        linked.filter((l) => changeOfRequirement.get(l.requirementId) === id).map((l) => l.runId),
      );
      return [
        id,
        evidence.filter((run) => run.changeRequestId === id || linkedHere.has(run.id)),
      ] as const;
    }),
  );
}
export type ChangeEvidenceRun = Awaited<ReturnType<typeof changeEvidence>>[number];
