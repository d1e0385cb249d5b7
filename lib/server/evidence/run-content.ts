import "server-only";
import { asc, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { evidenceFiles, testResults, testRuns, type TestRun } from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";

/**
 * Exactly what a signature on a run covers: the run's identity and context, its
 * raw data and the hashes of its files. Status is left out, so the "performed"
 * signature stays valid when the run is verified; any change to data or files
 * changes the hash and shows the signature as no longer valid.
 */
export async function runContent(db: Executor, run: TestRun) {
  const results = await db.select().from(testResults).where(eq(testResults.runId, run.id)).orderBy(asc(testResults.createdAt), asc(testResults.id));
  const files = await db.select().from(evidenceFiles).where(eq(evidenceFiles.runId, run.id)).orderBy(asc(evidenceFiles.uploadedAt), asc(evidenceFiles.id));
  const content = {
    number: run.number,
    revision: run.revision,
    partFamilyId: run.partFamilyId,
    recipeVersionId: run.recipeVersionId,
    testType: run.testType,
    technicianId: run.technicianId,
    lab: run.lab,
    performedOn: run.performedOn,
    changeRequestId: run.changeRequestId,
    protocolDocumentId: run.protocolDocumentId,
    requirement: run.requirement,
    runData: run.runData ?? null,
    results: results.map((r) => ({ sampleLabel: r.sampleLabel, basketPosition: r.basketPosition, worstCase: r.worstCase, data: r.data })),
    files: files.map((f) => ({ sha256: f.sha256, name: f.originalName, kind: f.kind, sampleLabel: f.sampleLabel })),
  };
  return { content, hash: sha256Hex(canonicalJson(content)), results, files };
}

export async function getRunRow(db: Executor, runId: string) {
  const [run] = await db.select().from(testRuns).where(eq(testRuns.id, runId));
  return run;
}
