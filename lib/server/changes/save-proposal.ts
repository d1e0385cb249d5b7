import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequestAssessments, changeRequests } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { assess, raiseProblem } from "@/lib/changes/assess";
import {
  addsPartFamily,
  CHANGE_KIND_LABELS,
  OPENED_ELSEWHERE,
  type ChangeKind,
} from "@/lib/changes/workflow";
import type { Proposal } from "@/lib/schemas/change";
import { UserFacingError } from "@/lib/server/errors";
import { loadRecipeSnapshot, writeRecipeContent } from "./snapshot";
import { NO_RECIPE } from "./state";

/**
 * Saves the engineer's proposal on a draft change request: the proposed recipe
 * version's stages and parameters, and any raised class. The justification is a
 * change-narrative document, saved by the documents editor.
 * The audit event records the parameter rows that differ from the last save.
 * A save made from an older reading (lock_version) is refused, never applied
 * over the other engineer's proposal.
 */
export async function saveProposal(
  actor: AuditActor & { id: string },
  input: Proposal,
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [cr] = await tx
      .select()
      .from(changeRequests)
      .where(eq(changeRequests.id, input.changeRequestId));
    if (!cr || !cr.toVersionId)
      throw new UserFacingError("That change request does not exist.", { kind: "not_found" });
    if (cr.status !== "draft")
      throw new UserFacingError("Only a draft change request can be edited: reopen it first.");
    const [a] = await tx
      .select()
      .from(changeRequestAssessments)
      .where(eq(changeRequestAssessments.changeRequestId, cr.id));
    // A kind opened from its own record (an initial validation, an equipment or specification
    // change) keeps it, since its diff comes from that record; no other change becomes one.
    const fixed = (k: ChangeKind) => OPENED_ELSEWHERE.includes(k);
    if ((fixed(a.kind) || fixed(input.kind)) && a.kind !== input.kind) {
      throw new UserFacingError(
        a.kind === "initial_validation"
          ? "This is the recipe's initial validation: its kind stays as it is."
          : fixed(a.kind)
            ? `This change was opened as "${CHANGE_KIND_LABELS[a.kind]}": its kind stays as it is.`
            : input.kind === "initial_validation"
              ? "An initial validation is routed from a new recipe's draft, not from a change."
              : `"${CHANGE_KIND_LABELS[input.kind]}" is opened from the record that changed, not chosen here.`,
        "kind",
      );
    }
    if (a.lockVersion !== input.lockVersion) {
      throw new UserFacingError(
        "Someone saved this proposal after you opened it. Nothing was saved and your edits are still here: copy what you need, reload to see their version, and save again.",
      );
    }

    const before = await loadRecipeSnapshot(tx, cr.toVersionId);
    const from = cr.fromVersionId ? await loadRecipeSnapshot(tx, cr.fromVersionId) : NO_RECIPE;
    const computed = assess({
      from,
      to: input.recipe,
      newPartFamily: addsPartFamily(input.kind) ? input.partFamilyId : null,
      raisedTo: null,
      matrix: [],
    }).computed;
    const problem = raiseProblem(computed, input.raiseTo);
    if (problem) throw new UserFacingError(problem, "raiseTo");

    await writeRecipeContent(tx, cr.toVersionId, input.recipe);
    await tx.update(changeRequests).set({ title: input.title }).where(eq(changeRequests.id, cr.id));
    const raisedTo = input.raiseTo && input.raiseTo !== computed ? input.raiseTo : null;
    const saved = await tx
      .update(changeRequestAssessments)
      .set({
        kind: input.kind,
        partFamilyId: addsPartFamily(input.kind) ? input.partFamilyId : null,
        raisedTo,
        raiseReason: raisedTo ? input.raiseReason : null,
        lockVersion: a.lockVersion + 1,
        updatedAt: now.toISOString(),
      })
      .where(
        and(
          eq(changeRequestAssessments.changeRequestId, cr.id),
          eq(changeRequestAssessments.lockVersion, input.lockVersion),
        ),
      )
      .returning({ lockVersion: changeRequestAssessments.lockVersion });
    if (saved.length !== 1)
      throw new UserFacingError("The proposal changed while saving. Nothing was saved; try again.");

    const changedRows = assess({
      from: before,
      to: input.recipe,
      newPartFamily: null,
      raisedTo: null,
      matrix: [],
    }).diff.parameters.filter((p) => p.change !== "unchanged");
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.proposal_saved",
        recordType: "change_request",
        recordId: cr.id,
        old: { title: cr.title, kind: a.kind, raisedTo: a.raisedTo, lockVersion: a.lockVersion },
        new: {
          lockVersion: saved[0].lockVersion,
          title: input.title,
          kind: input.kind,
          raisedTo,
          computedImpact: computed,
          parameters: changedRows.map((p) => ({
            key: p.key,
            old: p.old && {
              setpoint: p.old.setpoint,
              unit: p.old.unit,
              low: p.old.validatedLow,
              high: p.old.validatedHigh,
            },
            new: p.new && {
              setpoint: p.new.setpoint,
              unit: p.new.unit,
              low: p.new.validatedLow,
              high: p.new.validatedHigh,
            },
          })),
        },
        reason: raisedTo ? input.raiseReason : null,
      },
      now,
    );
    return { lockVersion: saved[0].lockVersion };
  });
}
