import "server-only";
import { asc, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { evidenceFiles, testSamples, testRuns, type TestRun } from "@/db/schema";
import { runContentHash } from "@/lib/evidence/run-hash";
import { getLabDetails } from "@/lib/server/lab-report/lab-details";
import { citedAssetNumbers } from "@/lib/server/instruments/cited";
import { getRunMethods } from "./run-methods";

/** The run's stored rows in a stable order, and the hash a signature binds to. */
export async function runContent(db: Executor, run: TestRun) {
  const samples = await db
    .select()
    .from(testSamples)
    .where(eq(testSamples.runId, run.id))
    .orderBy(asc(testSamples.createdAt), asc(testSamples.id));
  const files = await db
    .select()
    .from(evidenceFiles)
    .where(eq(evidenceFiles.runId, run.id))
    .orderBy(asc(evidenceFiles.uploadedAt), asc(evidenceFiles.id));
  const labDetails = await getLabDetails(db, run.id);
  const [instruments, methods] = await Promise.all([
    citedAssetNumbers(db, run.id),
    getRunMethods(db, run.id),
  ]);
  const { content, hash } = runContentHash(run, samples, files, labDetails, instruments, methods);
  return { content, hash, samples, files, labDetails, methods };
}

export async function getRunRow(db: Executor, runId: string) {
  const [run] = await db.select().from(testRuns).where(eq(testRuns.id, runId));
  return run;
}
