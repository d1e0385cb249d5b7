import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequestEvidence, changeRequestTests, testRuns } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { isUniqueViolation, UserFacingError } from "@/lib/server/errors";
import { loadChangeState } from "./state";

/**
 * Offers a test run on the proposed recipe version as the evidence for one required test.
 * The link is its own row: the run is left as signed, so its signatures keep binding.
 */
export async function linkEvidence(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string; requirementId: string; testRunId: string },
  now = new Date(),
) {
  try {
    await getDb().transaction(async (tx) => {
      const state = await loadChangeState(tx, input.changeRequestId);
      if (state.cr.status !== "requalification")
        throw new UserFacingError("Evidence is linked while the change is in requalification.");
      const [req] = await tx
        .select()
        .from(changeRequestTests)
        .where(
          and(
            eq(changeRequestTests.id, input.requirementId),
            eq(changeRequestTests.changeRequestId, state.cr.id),
          ),
        );
      if (!req)
        throw new UserFacingError("That required test is not part of this change request.", {
          kind: "not_found",
        });
      const [run] = await tx.select().from(testRuns).where(eq(testRuns.id, input.testRunId));
      if (!run)
        throw new UserFacingError("That test run does not exist.", {
          kind: "not_found",
          field: "testRunId",
        });
      if (run.recipeVersionId !== state.cr.toVersionId)
        throw new UserFacingError(
          `${run.number} was run on another recipe version, not the proposed version ${state.toVersion.version}.`,
          { kind: "invalid", field: "testRunId" },
        );
      if (run.testType !== req.testType)
        throw new UserFacingError(
          `${run.number} is not a ${TEST_TYPE_LABELS[req.testType].toLowerCase()} test.`,
          { kind: "invalid", field: "testRunId" },
        );
      await tx.insert(changeRequestEvidence).values({
        requirementId: req.id,
        testRunId: run.id,
        linkedBy: actor.id,
        linkedAt: now.toISOString(),
      });
      await appendAudit(
        tx,
        actor,
        {
          eventType: "change.evidence_linked",
          recordType: "change_request",
          recordId: state.cr.id,
          new: { requirement: req.testType, samplesRequired: req.samples, testRun: run.number },
        },
        now,
      );
    });
  } catch (error) {
    if (isUniqueViolation(error))
      throw new UserFacingError("That run is already linked to this requirement.", "testRunId");
    throw error;
  }
}
