import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { evidenceFiles, testRunLabDetails, testSamples } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { ParticleRunData, ParticleSample } from "@/lib/schemas/evidence";
import { PARTICLE_TYPES, PARTICLE_TYPE_LABELS, type LabDetails } from "@/lib/schemas/lab-details";
import { UserFacingError } from "@/lib/server/errors";
import { requireOpenRun } from "@/lib/server/evidence/guards";
import { refreshOutcome } from "@/lib/server/evidence/refresh-outcome";
import { assertCountsWithinLimit, getLabDetails } from "./lab-details";

/**
 * Records how an open particle run was extracted and analysed and on which parts. The details are
 * part of the run's content hash and of its outcome (analysed classes, wetted area), so both are
 * recomputed in the same transaction.
 */
export async function saveLabDetails(
  actor: AuditActor & { id: string },
  input: { runId: string; details: LabDetails },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    if (run.testType !== "particle_cleanliness")
      throw new UserFacingError(
        "Extraction and analysis details belong to particle cleanliness runs.",
        { kind: "invalid" },
      );
    const { details } = input;
    const limit = details.analysis.lowerSizeLimitUm;
    const field = () => "analysis.lowerSizeLimitUm";
    const samples = await tx.select().from(testSamples).where(eq(testSamples.runId, run.id));
    for (const s of samples) {
      const data = s.data as ParticleSample;
      assertCountsWithinLimit(data.counts ?? {}, limit, { what: `Sample ${s.sampleLabel}`, field });
    }
    const blank = (run.runData as ParticleRunData | null)?.blank;
    if (blank) assertCountsWithinLimit(blank.counts, limit, { what: "The blank", field });

    const files = await tx
      .select({ id: evidenceFiles.id })
      .from(evidenceFiles)
      .where(eq(evidenceFiles.runId, run.id));
    const labels = new Set(samples.map((s) => s.sampleLabel));
    for (const type of PARTICLE_TYPES) {
      const p = details.largest[type];
      if (p.photoFileId && !files.some((f) => f.id === p.photoFileId))
        throw new UserFacingError(
          `The photo of the largest ${PARTICLE_TYPE_LABELS[type].toLowerCase()} particle must be a file attached to this run.`,
          { kind: "invalid", field: `largest.${type}.photoFileId` },
        );
      if (p.sampleLabel && !labels.has(p.sampleLabel))
        throw new UserFacingError(`No sample "${p.sampleLabel}" is recorded in this run.`, {
          kind: "invalid",
          field: `largest.${type}.sampleLabel`,
        });
    }

    const old = await getLabDetails(tx, run.id);
    const row = { details, updatedBy: actor.id, updatedAt: now.toISOString() };
    await tx
      .insert(testRunLabDetails)
      .values({ runId: run.id, ...row })
      .onConflictDoUpdate({ target: testRunLabDetails.runId, set: row });
    await refreshOutcome(tx, run);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "test_run.lab_details_saved",
        recordType: "test_run",
        recordId: run.id,
        old: { details: old },
        new: { details },
      },
      now,
    );
  });
}
