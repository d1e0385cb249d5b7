// Not "server-only": the demo seed approves its methods under tsx; people sign through `approveMethod`.
import { and, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { labMethods } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { UserFacingError } from "@/lib/server/errors";
import { loadMethod, methodLabel } from "./state";

/**
 * An approver other than the drafter signs "approved" on the draft's content hash; the version
 * becomes citable and the version approved before it is superseded, in one transaction.
 */
export async function approveMethodIn(
  tx: Tx,
  signer: { id: string; name: string },
  input: { methodId: string; contentHash: string },
  now = new Date(),
) {
  const view = await loadMethod(tx, input.methodId);
  const m = view.method;
  if (m.status !== "draft")
    throw new UserFacingError(`${methodLabel(m)} is ${m.status}; only a draft is approved.`);
  if (view.contentHash !== input.contentHash)
    throw new UserFacingError(
      "This method changed since you opened it. Nothing was signed; read it again and sign what is shown.",
    );
  if (m.createdBy === signer.id)
    throw new UserFacingError("The person who drafted a method does not approve it.", {
      kind: "forbidden",
    });
  await applySignature(
    tx,
    {
      signer,
      recordType: "lab_method",
      recordId: m.id,
      meaning: "approved",
      contentHash: view.contentHash,
    },
    now,
  );
  const [previous] = await tx
    .select({ id: labMethods.id, version: labMethods.version })
    .from(labMethods)
    .where(and(eq(labMethods.code, m.code), eq(labMethods.status, "approved")));
  if (previous) {
    await tx
      .update(labMethods)
      .set({ status: "superseded", supersededAt: now.toISOString() })
      .where(eq(labMethods.id, previous.id));
    await appendAudit(
      tx,
      signer,
      {
        eventType: "lab_method.superseded",
        recordType: "lab_method",
        recordId: previous.id,
        old: { status: "approved" },
        new: { status: "superseded", by: methodLabel(m) },
      },
      now,
    );
  }
  await tx
    .update(labMethods)
    .set({ status: "approved", approvedBy: signer.id, approvedAt: now.toISOString() })
    .where(eq(labMethods.id, m.id));
  await appendAudit(
    tx,
    signer,
    {
      eventType: "lab_method.approved",
      recordType: "lab_method",
      recordId: m.id,
      old: { status: "draft" },
      new: {
        status: "approved",
        contentHash: view.contentHash,
        supersedes: previous ? methodLabel({ code: m.code, version: previous.version }) : null,
      },
    },
    now,
  );
}
