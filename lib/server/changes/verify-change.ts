import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { UserFacingError } from "@/lib/server/errors";
import { assertHash, assertStep } from "./guard";
import { notifyNext } from "./notify";
import { loadGate } from "./snapshot";
import { loadChangeState } from "./state";

/** The gate as a refusal: exactly what is missing, one line each. */
export function gateRefusal(missing: string[]) {
  return new UserFacingError(
    `The requalification gate is not met. Missing: ${missing.join("; ")}.`,
  );
}

/** A second person confirms the change is implemented and, where tests were required, that the gate holds. */
export async function verifyChange(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string; password: string; contentHash: string },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    assertStep(state, "verify");
    assertHash(state, input.contentHash);
    const { gate } = await loadGate(tx, state.cr.id);
    if (!gate.holds) throw gateRefusal(gate.missing);
    await applySignature(
      tx,
      {
        signer,
        recordType: "change_request",
        recordId: state.signatureRecordId,
        meaning: "verified",
        contentHash: state.contentHash,
      },
      now,
    );
    await tx
      .update(changeRequests)
      .set({ status: "verified" })
      .where(eq(changeRequests.id, state.cr.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.verified",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: state.cr.status },
        new: {
          status: "verified",
          evidence: gate.requirements.map((r) => `${r.requirement.testType}: ${r.satisfiedBy}`),
        },
      },
      now,
    );
    await notifyNext(tx, {
      cr: state.cr,
      status: "verified",
      actorName: actor.name,
      nextStep: `close the change to make ${state.recipe.code} version ${state.toVersion.version} effective.`,
      roles: ["approver"],
    });
  });
}
