import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests, recipeVersions, requalificationIntervals, signatures } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { closureProblem } from "@/lib/signatures/rules";
import { addsPartFamily } from "@/lib/changes/workflow";
import { setNarrativeStatus } from "./narrative-status";
import { assertStep } from "./guard";
import { notifyNext } from "./notify";
import { loadGate } from "./snapshot";
import { loadChangeState } from "./state";
import { gateRefusal } from "./verify-change";
import { applyEquipmentChange } from "@/lib/server/systems/equipment-change";
import { affectedDocumentsMissing } from "@/lib/changes/affected-documents";
import { loadAffectedDocuments } from "./affected-documents";
import { openEffectivenessCheck } from "./effectiveness";
import { loadEmergencies } from "./emergencies";
import { assertCustomerApproval } from "./customer-approval";

/**
 * Closes a verified change: in one transaction the old version is superseded, the
 * proposed one becomes effective (the database allows one effective version per
 * recipe), and the validated part families carry over to it. A major change
 * requalified them today; a minor one keeps their last qualification date.
 */
export async function closeChange(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    // Asked to close during requalification, say what evidence is missing before saying "verify first".
    if (state.cr.status !== "requalification") assertStep(state, "close");
    const { gate } = await loadGate(tx, state.cr.id);
    if (!gate.holds) throw gateRefusal(gate.missing);
    assertStep(state, "close");
    const signers = await tx
      .select({ userId: signatures.userId, meaning: signatures.meaning })
      .from(signatures)
      .where(
        and(
          eq(signatures.recordType, "change_request"),
          eq(signatures.recordId, state.signatureRecordId),
        ),
      );
    const problem = closureProblem(signers, actor.id);
    if (problem) throw new UserFacingError(problem);
    const documentsMissing = affectedDocumentsMissing(await loadAffectedDocuments(tx, state.cr));
    if (documentsMissing.length > 0)
      throw new UserFacingError(
        `Not closed: each affected document must be revised through the document workflow or confirmed unaffected with a reason. Missing: ${documentsMissing.join("; ")}.`,
      );
    await assertCustomerApproval(tx, state);
    // An emergency change put its version in force when it was implemented: closing keeps it so.
    const inForce = (await loadEmergencies(tx, [state.cr.id])).has(state.cr.id);
    const at = now.toISOString();
    const old = state.fromVersion;
    if (old && !inForce)
      await tx
        .update(recipeVersions)
        .set({ status: "superseded", effectiveTo: at })
        .where(and(eq(recipeVersions.id, old.id), eq(recipeVersions.status, "effective")));
    if (!inForce)
      await tx
        .update(recipeVersions)
        .set({ status: "effective", effectiveFrom: at })
        .where(eq(recipeVersions.id, state.toVersion.id));
    await tx
      .update(changeRequests)
      .set({ status: "closed", closedAt: at })
      .where(eq(changeRequests.id, state.cr.id));
    if (state.assessmentRow.kind === "equipment")
      await applyEquipmentChange(tx, actor, state.cr, at);

    const carried = old
      ? await tx
          .select()
          .from(requalificationIntervals)
          .where(eq(requalificationIntervals.recipeVersionId, old.id))
      : [];
    const families = new Map(carried.map((c) => [c.partFamilyId, c]));
    // The family the change adds, or the one a new recipe was first validated for, is qualified today.
    if (
      addsPartFamily(state.assessmentRow.kind) &&
      state.assessmentRow.partFamilyId &&
      !families.has(state.assessmentRow.partFamilyId)
    ) {
      families.set(state.assessmentRow.partFamilyId, {
        partFamilyId: state.assessmentRow.partFamilyId,
        intervalMonths: 12,
        lastQualifiedAt: at,
      } as (typeof carried)[number]);
    }
    for (const [partFamilyId, c] of families) {
      const lastQualifiedAt = state.impact === "major" ? at : c.lastQualifiedAt;
      const basis =
        state.assessmentRow.kind === "initial_validation"
          ? `Initial validation ${state.cr.number}`
          : null;
      const [row] = await tx
        .insert(requalificationIntervals)
        .values({
          recipeVersionId: state.toVersion.id,
          partFamilyId,
          intervalMonths: c.intervalMonths,
          lastQualifiedAt,
          basis,
          qualifiedBy: basis ? actor.id : null,
        })
        .returning();
      await appendAudit(
        tx,
        actor,
        {
          eventType: "requalification_interval.set",
          recordType: "requalification_interval",
          recordId: row.id,
          new: {
            recipeVersion: state.toVersion.version,
            partFamilyId,
            intervalMonths: c.intervalMonths,
            lastQualifiedAt,
          },
        },
        now,
      );
    }
    if (old && !inForce)
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
    if (!inForce)
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
    await setNarrativeStatus(tx, state.cr.narrativeDocumentId, "effective", now);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.closed",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: "verified" },
        new: { status: "closed", effectiveVersion: state.toVersion.version },
      },
      now,
    );
    await openEffectivenessCheck(tx, actor, state.cr, now);
    await notifyNext(tx, {
      cr: state.cr,
      status: "closed",
      actorName: actor.name,
      nextStep: `${state.recipe.code} version ${state.toVersion.version} is effective; brief the operators on the new settings.`,
      userIds: [state.cr.createdBy],
    });
  });
}
