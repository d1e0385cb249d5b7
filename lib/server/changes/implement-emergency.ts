import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { emergencyChanges, recipeVersions } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { approvalDueProblem } from "@/lib/changes/emergency";
import { todayUtc } from "@/lib/format/date";
import { UserFacingError } from "@/lib/server/errors";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { assertHash } from "./guard";
import { assertCustomerApproval } from "./customer-approval";
import { enqueueEmail } from "@/lib/email/outbox";
import { emergencyImplementedEmail } from "@/templates/email/emergency-change";
import { usersWithRole } from "./snapshot";
import { getChangeControlSettings } from "./settings";
import { loadChangeState } from "./state";

/** The emergency signature is filed apart from the revision's own ("authored" is already taken there). */
export const emergencyRecordId = (changeRequestId: string) => `${changeRequestId}#emergency`;

/**
 * An emergency change (issue #13 item 3): the engineer who assessed the change signs it into
 * force before approval, with the justification and the date by which an approver must sign.
 * In one transaction the effective version is superseded and the proposed one takes force;
 * the change itself stays "impact assessed" and goes on through approval, requalification,
 * verification and closure as any other.
 */
export async function implementEmergency(
  actor: AuditActor & { id: string },
  input: {
    changeRequestId: string;
    password: string;
    contentHash: string;
    justification: string;
    approvalDueOn: string;
  },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  await getDb().transaction((tx) => implementEmergencyIn(tx, actor, signer, input, now));
}

export async function implementEmergencyIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  signer: { id: string; name: string },
  input: {
    changeRequestId: string;
    contentHash: string;
    justification: string;
    approvalDueOn: string;
  },
  now: Date,
) {
  const state = await loadChangeState(tx, input.changeRequestId);
  if (state.assessmentRow.kind === "initial_validation")
    throw new UserFacingError(
      "A new recipe's initial validation cannot be implemented as an emergency: nothing was validated before it.",
    );
  const [already] = await tx
    .select()
    .from(emergencyChanges)
    .where(eq(emergencyChanges.changeRequestId, state.cr.id));
  if (already)
    throw new UserFacingError("This change was already implemented as an emergency.", {
      kind: "conflict",
    });
  if (state.cr.status !== "impact_assessed")
    throw new UserFacingError(
      "Only a change whose impact is assessed and that is not yet approved can be implemented as an emergency.",
    );
  assertHash(state, input.contentHash);
  const { emergencyApprovalDays } = await getChangeControlSettings(tx);
  const problem = approvalDueProblem(input.approvalDueOn, todayUtc(now), emergencyApprovalDays);
  if (problem) throw new UserFacingError(problem, { kind: "invalid", field: "approvalDueOn" });
  const old = state.fromVersion;
  if (!old || old.status !== "effective")
    throw new UserFacingError(
      "The version this change replaces is no longer the effective one: reload the change.",
      { kind: "conflict" },
    );

  // The customer's approval is required before the new version takes force, emergency or not.
  await assertCustomerApproval(tx, state);
  const signature = await applySignature(
    tx,
    {
      signer,
      recordType: "change_request",
      recordId: emergencyRecordId(state.cr.id),
      meaning: "authored",
      contentHash: state.contentHash,
      comment: "Implemented as an emergency change before approval",
    },
    now,
  );
  const at = now.toISOString();
  await tx
    .update(recipeVersions)
    .set({ status: "superseded", effectiveTo: at })
    .where(and(eq(recipeVersions.id, old.id), eq(recipeVersions.status, "effective")));
  await tx
    .update(recipeVersions)
    .set({ status: "effective", effectiveFrom: at })
    .where(eq(recipeVersions.id, state.toVersion.id));
  await tx.insert(emergencyChanges).values({
    changeRequestId: state.cr.id,
    justification: input.justification,
    implementedBy: actor.id,
    implementedAt: at,
    approvalDueOn: input.approvalDueOn,
    signatureId: signature.id,
  });
  await appendAudit(
    tx,
    actor,
    {
      eventType: "recipe_version.superseded",
      recordType: "recipe_version",
      recordId: old.id,
      old: { status: "effective" },
      new: {
        status: "superseded",
        effectiveTo: at,
        by: state.toVersion.version,
        changeRequest: state.cr.number,
      },
    },
    now,
  );
  await appendAudit(
    tx,
    actor,
    {
      eventType: "recipe_version.effective",
      recordType: "recipe_version",
      recordId: state.toVersion.id,
      old: { status: "proposed" },
      new: { status: "effective", effectiveFrom: at, changeRequest: state.cr.number },
    },
    now,
  );
  await appendAudit(
    tx,
    actor,
    {
      eventType: "change.emergency_implemented",
      recordType: "change_request",
      recordId: state.cr.id,
      new: {
        effectiveVersion: state.toVersion.version,
        supersededVersion: old.version,
        approvalDueOn: input.approvalDueOn,
        contentHash: state.contentHash,
      },
      reason: input.justification,
    },
    now,
  );
  const mail = emergencyImplementedEmail({
    number: state.cr.number,
    title: state.cr.title,
    engineer: actor.name,
    version: state.toVersion.version,
    approvalDueOn: input.approvalDueOn,
    changeRequestId: state.cr.id,
  });
  for (const u of await usersWithRole(tx, "approver"))
    await enqueueEmail(tx, { to: u.email, ...mail }, now);
}
