import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequestAssessments, changeRequests, changeRequestTests } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { setNarrativeStatus } from "./narrative-status";
import { assertStep } from "./guard";
import { loadChangeState } from "./state";
import { loadEmergencies } from "./emergencies";
import { UserFacingError } from "@/lib/server/errors";

/** Back to draft for editing: a new revision, so the signatures already given stay with the old one. */
export async function reopenChange(
  actor: AuditActor,
  input: { changeRequestId: string; reason: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    assertStep(state, "reopen");
    if ((await loadEmergencies(tx, [state.cr.id])).size > 0)
      throw new UserFacingError(
        "This emergency change is in force as signed: approve or reject it; it cannot be reopened for editing.",
      );
    await tx.delete(changeRequestTests).where(eq(changeRequestTests.changeRequestId, state.cr.id));
    await tx
      .update(changeRequests)
      .set({ status: "draft", impact: null, impactDetails: null })
      .where(eq(changeRequests.id, state.cr.id));
    await tx
      .update(changeRequestAssessments)
      .set({
        revision: state.assessmentRow.revision + 1,
        contentHash: null,
        computedImpact: null,
        matrixId: null,
        updatedAt: now.toISOString(),
      })
      .where(eq(changeRequestAssessments.changeRequestId, state.cr.id));
    await setNarrativeStatus(tx, state.cr.narrativeDocumentId, "draft", now);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.reopened",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: state.cr.status, revision: state.assessmentRow.revision },
        new: { status: "draft", revision: state.assessmentRow.revision + 1 },
        reason: input.reason,
      },
      now,
    );
  });
}
