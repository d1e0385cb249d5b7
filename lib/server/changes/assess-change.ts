import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequestAssessments, changeRequests, changeRequestTests } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { UserFacingError } from "@/lib/server/errors";
import { setNarrativeStatus } from "./narrative-status";
import { assertHash, assertStep } from "./guard";
import { notifyNext } from "./notify";
import { loadChangeState } from "./state";

/**
 * The engineer submits the computed impact: the assessment and the required
 * tests are frozen with the matrix version used, and the engineer signs "authored".
 */
export async function assessChange(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string; password: string; contentHash: string },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  return getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    assertStep(state, "assess");
    assertHash(state, input.contentHash);
    const { assessment } = state;
    if (
      !state.subject?.changes.length &&
      assessment.impact === "editorial" &&
      state.assessment.diff.texts.length === 0 &&
      state.assessment.diff.stages.length === 0 &&
      state.assessment.diff.parameters.every((p) => p.change === "unchanged")
    ) {
      throw new UserFacingError(
        "The proposal is the same as the effective version: change something first.",
      );
    }
    if (!state.narrative || !JSON.stringify(state.narrative.content).includes('"text"')) {
      throw new UserFacingError("Write the justification and risk assessment before submitting.", {
        kind: "invalid",
        field: "narrative",
      });
    }
    if (assessment.impact === "major" && state.matrixId === null)
      throw new UserFacingError(
        "No requalification matrix is set: an administrator must set one first.",
      );
    if (assessment.impact === "major" && state.requirements.length === 0)
      throw new UserFacingError(
        "The requalification matrix maps none of these changes to a test: ask an administrator to complete it.",
      );

    for (const r of state.requirements) {
      await tx.insert(changeRequestTests).values({
        changeRequestId: state.cr.id,
        testType: r.testType,
        samples: r.samples,
        confidencePct: r.confidencePct,
        reliabilityPct: r.reliabilityPct,
        minCycles: r.minCycles,
        because: r.because,
      });
    }
    const details = {
      computed: assessment.computed,
      raisedTo: state.assessmentRow.raisedTo,
      raiseReason: state.assessmentRow.raiseReason,
      matrixVersion: state.matrixVersion,
      diff: assessment.diff,
      triggers: assessment.triggers,
      tests: assessment.tests,
    };
    await tx
      .update(changeRequests)
      .set({ status: "impact_assessed", impact: assessment.impact, impactDetails: details })
      .where(eq(changeRequests.id, state.cr.id));
    await tx
      .update(changeRequestAssessments)
      .set({
        computedImpact: assessment.computed,
        matrixId: state.matrixId,
        contentHash: state.contentHash,
        updatedAt: now.toISOString(),
      })
      .where(eq(changeRequestAssessments.changeRequestId, state.cr.id));
    await setNarrativeStatus(tx, state.cr.narrativeDocumentId, "in_review", now);
    await applySignature(
      tx,
      {
        signer,
        recordType: "change_request",
        recordId: state.signatureRecordId,
        meaning: "authored",
        contentHash: state.contentHash,
      },
      now,
    );
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.impact_assessed",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: "draft" },
        new: {
          status: "impact_assessed",
          impact: assessment.impact,
          computed: assessment.computed,
          matrixVersion: state.matrixVersion,
          tests: state.requirements.map((r) => `${r.testType} × ${r.samples}`),
          contentHash: state.contentHash,
        },
        reason: state.assessmentRow.raiseReason,
      },
      now,
    );
    await notifyNext(tx, {
      cr: state.cr,
      status: "impact_assessed",
      actorName: actor.name,
      nextStep: `approve or reject the ${assessment.impact} change.`,
      roles: ["approver"],
    });
    return { impact: assessment.impact };
  });
}
