// Not "server-only": the demo seed signs its control plan under tsx; people sign through sign-control-plan.ts.
import { eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { controlPlanVersions } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { ControlPlanStatus } from "@/lib/control-plans/characteristics";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { UserFacingError } from "@/lib/server/errors";
import { loadControlPlanOfVersion } from "./state";

export type ControlPlanMeaning = "authored" | "reviewed" | "approved";

/** Which status each signature takes a version from, and to. */
const STEPS: Record<ControlPlanMeaning, { from: ControlPlanStatus; to: ControlPlanStatus }> = {
  authored: { from: "draft", to: "in_review" },
  reviewed: { from: "in_review", to: "reviewed" },
  approved: { from: "reviewed", to: "effective" },
};

const WAITING: Record<ControlPlanStatus, string> = {
  draft: "it is a draft: its author signs it first",
  in_review: "it waits for a reviewer",
  reviewed: "it waits for an approver",
  effective: "it is already approved and effective",
  superseded: "a newer version superseded it",
};

/**
 * The author signs "authored" (draft → in review), a reviewer "reviewed", an approver "approved",
 * which makes the version effective and supersedes the one before. Every signature binds to the
 * content hash the signer was shown; author, reviewer and approver are three people.
 */
export async function signControlPlanIn(
  tx: Tx,
  signer: { id: string; name: string },
  input: { versionId: string; meaning: ControlPlanMeaning; contentHash: string },
  now = new Date(),
) {
  const { view, version } = await loadControlPlanOfVersion(tx, input.versionId);
  const step = STEPS[input.meaning];
  if (version.status !== step.from)
    throw new UserFacingError(
      `Version ${version.version} cannot be signed "${input.meaning}" now: ${WAITING[version.status]}.`,
    );
  if (version.contentHash !== input.contentHash)
    throw new UserFacingError(
      "This control plan changed since you opened it. Nothing was signed; read it again and sign what is shown.",
    );
  if (input.meaning === "authored" && signer.id !== version.createdBy)
    throw new UserFacingError("Only the person who drafted this version signs it as author.", {
      kind: "forbidden",
    });
  if (version.lines.length === 0)
    throw new UserFacingError("A control plan without lines schedules nothing: add a line first.");
  // Refuses one person taking two of author, reviewer and approver (segregation of duties).
  await applySignature(
    tx,
    {
      signer,
      recordType: "control_plan_version",
      recordId: version.id,
      meaning: input.meaning,
      contentHash: version.contentHash,
    },
    now,
  );
  const at = now.toISOString();
  if (step.to === "effective" && view.effective) {
    await tx
      .update(controlPlanVersions)
      .set({ status: "superseded", supersededAt: at })
      .where(eq(controlPlanVersions.id, view.effective.id));
    await appendAudit(
      tx,
      signer,
      {
        eventType: "control_plan.status_changed",
        recordType: "control_plan_version",
        recordId: view.effective.id,
        old: { status: "effective" },
        new: { status: "superseded", contentHash: view.effective.contentHash },
        reason: `Superseded by version ${version.version}`,
      },
      now,
    );
  }
  await tx
    .update(controlPlanVersions)
    .set({ status: step.to, ...(step.to === "effective" ? { effectiveAt: at } : {}) })
    .where(eq(controlPlanVersions.id, version.id));
  await appendAudit(
    tx,
    signer,
    {
      eventType: "control_plan.status_changed",
      recordType: "control_plan_version",
      recordId: version.id,
      old: { status: step.from },
      new: { status: step.to, contentHash: version.contentHash },
    },
    now,
  );
  return { planId: view.plan.id, status: step.to };
}

/** A reviewer or approver sends a version back to its author as a draft, saying why. */
export async function returnControlPlanIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: { versionId: string; reason: string },
  now = new Date(),
) {
  const { view, version } = await loadControlPlanOfVersion(tx, input.versionId);
  if (version.status !== "in_review" && version.status !== "reviewed")
    throw new UserFacingError(
      `Version ${version.version} is not waiting for review or approval: ${WAITING[version.status]}.`,
    );
  await tx
    .update(controlPlanVersions)
    .set({ status: "draft" })
    .where(eq(controlPlanVersions.id, version.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "control_plan.status_changed",
      recordType: "control_plan_version",
      recordId: version.id,
      old: { status: version.status },
      new: { status: "draft", contentHash: version.contentHash },
      reason: input.reason,
    },
    now,
  );
  return { planId: view.plan.id };
}
