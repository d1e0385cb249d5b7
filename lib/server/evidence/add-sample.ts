import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { testSamples } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertCountsWithinLimit, getLabDetails } from "@/lib/server/lab-report/lab-details";
import { requireOpenRun } from "./guards";
import { refreshOutcome } from "./refresh-outcome";

export interface SampleRow {
  sampleLabel: string;
  cycleNumber?: string;
  basketPosition?: string;
  worstCase: boolean;
  [key: string]: unknown;
}

/** Adds one sample's validated raw data to an open run and recomputes the outcome. */
export async function addSample(actor: AuditActor, input: { runId: string; sample: SampleRow }) {
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    const { sampleLabel, cycleNumber, basketPosition, worstCase, ...data } = input.sample;
    const [dup] = await tx
      .select({ id: testSamples.id })
      .from(testSamples)
      .where(and(eq(testSamples.runId, run.id), eq(testSamples.sampleLabel, sampleLabel)));
    if (dup)
      throw new UserFacingError(
        `Sample "${sampleLabel}" is already recorded in this run.`,
        "sampleLabel",
      );
    const lab = run.testType === "particle_cleanliness" ? await getLabDetails(tx, run.id) : null;
    if (lab)
      assertCountsWithinLimit(
        (data.counts ?? {}) as Partial<Record<string, number>>,
        lab.analysis.lowerSizeLimitUm,
        { what: `Sample ${sampleLabel}`, field: (k) => `counts.${k}` },
      );
    const [row] = await tx
      .insert(testSamples)
      .values({
        runId: run.id,
        sampleLabel,
        cycleNumber: cycleNumber ?? null,
        basketPosition: basketPosition ?? null,
        worstCase,
        data,
      })
      .returning();
    const outcome = await refreshOutcome(tx, run);
    await appendAudit(tx, actor, {
      eventType: "test_run.sample_added",
      recordType: "test_run",
      recordId: run.id,
      new: {
        sampleId: row.id,
        sampleLabel,
        ...(cycleNumber ? { cycleNumber } : {}),
        basketPosition: basketPosition ?? null,
        worstCase,
        data,
        outcome: outcome.outcome,
      },
    });
    return row;
  });
}
