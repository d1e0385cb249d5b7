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
import { getLabDetails } from "@/lib/server/lab-report/lab-details";

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
  // The three columns the outcome reads: a run imported from a 100,000-row file is read whole here.
  const samples = await db
    .select({
      sampleLabel: testSamples.sampleLabel,
      worstCase: testSamples.worstCase,
      data: testSamples.data,
    })
    .from(testSamples)
    .where(eq(testSamples.runId, run.id));
  const photos = await db
    .select({ id: evidenceFiles.id })
    .from(evidenceFiles)
    .where(and(eq(evidenceFiles.runId, run.id), eq(evidenceFiles.kind, "photo")));
  const lab = await getLabDetails(db, run.id);
  return computeRunOutcome({
    testType: run.testType,
    // The wetted area recorded with the run is that of the parts tested; the family's is the default.
    family: lab ? { ...family.family, wettedAreaCm2: lab.component.wettedAreaCm2 } : family.family,
    lowerSizeLimitUm: lab?.analysis.lowerSizeLimitUm ?? null,
    spec: family.spec,
    conductivityLimitUsPerCm: limit?.setpoint ?? null,
    samples,
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
