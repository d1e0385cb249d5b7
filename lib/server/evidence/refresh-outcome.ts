import "server-only";
import { and, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  cleanlinessSpecs,
  evidenceFiles,
  partFamilies,
  recipeParameters,
  testSamples,
  testRuns,
  type TestRun,
} from "@/db/schema";
import { computeRunOutcome, type RunOutcome } from "@/lib/evidence/outcome";

/** Everything the outcome is computed from, read from the stored rows. */
export async function computeStoredOutcome(db: Executor, run: TestRun): Promise<RunOutcome> {
  const [family] = await db
    .select({ family: partFamilies, spec: cleanlinessSpecs })
    .from(partFamilies)
    // The revision in force when the run was opened; older rows fall back to the family's.
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, run.specId ?? partFamilies.specId))
    .where(eq(partFamilies.id, run.partFamilyId));
  const [limit] = await db
    .select({ setpoint: recipeParameters.setpoint })
    .from(recipeParameters)
    .where(
      and(
        eq(recipeParameters.versionId, run.recipeVersionId),
        eq(recipeParameters.kind, "conductivity_limit"),
      ),
    );
  const samples = await db.select().from(testSamples).where(eq(testSamples.runId, run.id));
  const photos = await db
    .select({ id: evidenceFiles.id })
    .from(evidenceFiles)
    .where(and(eq(evidenceFiles.runId, run.id), eq(evidenceFiles.kind, "photo")));
  return computeRunOutcome({
    testType: run.testType,
    family: family.family,
    spec: family.spec,
    conductivityLimitUsPerCm: limit?.setpoint ?? null,
    samples: samples.map((s) => ({
      sampleLabel: s.sampleLabel,
      worstCase: s.worstCase,
      data: s.data,
    })),
    runData: run.runData,
    photoCount: photos.length,
  });
}

/** Stores the computed outcome word on the run so lists can filter by it; it is never typed. */
export async function refreshOutcome(tx: Executor, run: TestRun) {
  const result = await computeStoredOutcome(tx, run);
  if (result.outcome !== run.outcome)
    await tx.update(testRuns).set({ outcome: result.outcome }).where(eq(testRuns.id, run.id));
  return result;
}
