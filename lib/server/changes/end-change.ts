import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests, recipeVersions } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { setNarrativeStatus } from "./narrative-status";
import { assertStep } from "./guard";
import { notifyNext } from "./notify";
import { loadChangeState } from "./state";
import { loadEmergencies } from "./emergencies";
import { reverseEmergency } from "./reverse-emergency";

/** Rejection (approver) or withdrawal (engineer) from any open step; the proposed version is withdrawn with it. */
export async function endChange(
  actor: AuditActor,
  input: { changeRequestId: string; reason: string; how: "reject" | "withdraw" },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    assertStep(state, input.how);
    const status = input.how === "reject" ? "rejected" : "withdrawn";
    await tx
      .update(changeRequests)
      .set({ status, closedAt: now.toISOString() })
      .where(eq(changeRequests.id, state.cr.id));
    // A new recipe's first version goes back to its draft, so it can be corrected and routed again.
    const initial = state.assessmentRow.kind === "initial_validation";
    const emergency = (await loadEmergencies(tx, [state.cr.id])).get(state.cr.id);
    if (emergency && state.fromVersion) await reverseEmergency(tx, actor, state, input.reason, now);
    else
      await tx
        .update(recipeVersions)
        .set({ status: initial ? "draft" : "withdrawn" })
        .where(eq(recipeVersions.id, state.toVersion.id));
    await setNarrativeStatus(tx, state.cr.narrativeDocumentId, "retired", now);
    await appendAudit(
      tx,
      actor,
      {
        eventType: input.how === "reject" ? "change.rejected" : "change.withdrawn",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: state.cr.status },
        new: { status },
        reason: input.reason,
      },
      now,
    );
    if (initial) {
      await appendAudit(
        tx,
        actor,
        {
          eventType: "recipe_version.returned_to_draft",
          recordType: "recipe_version",
          recordId: state.toVersion.id,
          old: { status: "proposed" },
          new: { status: "draft", changeRequest: state.cr.number },
          reason: input.reason,
        },
        now,
      );
    } else if (!emergency) {
      await appendAudit(
        tx,
        actor,
        {
          eventType: "recipe_version.withdrawn",
          recordType: "recipe_version",
          recordId: state.toVersion.id,
          old: { status: "proposed" },
          new: { status: "withdrawn", changeRequest: state.cr.number },
          reason: input.reason,
        },
        now,
      );
    }
    if (input.how === "reject")
      await notifyNext(tx, {
        cr: state.cr,
        status,
        actorName: actor.name,
        nextStep: `read the reason: ${input.reason}`,
        userIds: [state.cr.createdBy],
      });
  });
}
