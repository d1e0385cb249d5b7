import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { setNarrativeStatus } from "./narrative-status";
import { assertHash, assertStep } from "./guard";
import { notifyNext } from "./notify";
import { loadChangeState } from "./state";

/** The approver signs "approved" on exactly the assessed revision; the author may not (segregation of duties). */
export async function approveChange(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string; password: string; contentHash: string },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    assertStep(state, "approve");
    assertHash(state, input.contentHash);
    await applySignature(
      tx,
      {
        signer,
        recordType: "change_request",
        recordId: state.signatureRecordId,
        meaning: "approved",
        contentHash: state.contentHash,
      },
      now,
    );
    await tx
      .update(changeRequests)
      .set({ status: "approved_for_implementation" })
      .where(eq(changeRequests.id, state.cr.id));
    await setNarrativeStatus(tx, state.cr.narrativeDocumentId, "approved", now);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.approved",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: "impact_assessed" },
        new: { status: "approved_for_implementation", impact: state.impact },
      },
      now,
    );
    const tests = state.requirements.length;
    await notifyNext(tx, {
      cr: state.cr,
      status: "approved_for_implementation",
      actorName: actor.name,
      nextStep: tests
        ? `start requalification: ${tests} required test${tests > 1 ? "s" : ""}.`
        : "no requalification is required: a reviewer or approver verifies the change.",
      userIds: [state.cr.createdBy],
      roles: tests ? [] : ["reviewer"],
    });
  });
}
