import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentReviews, documentVersions, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { UserFacingError } from "@/lib/server/errors";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { approvedEmail } from "@/templates/email/documents";
import { makeEffectiveInTx } from "./make-effective";
import { assertTransition, findMyActiveStep, loadVersion, type DocumentActor } from "./shared";
import { todayUtc } from "@/lib/format/date";

/**
 * The approver signs "approved" on exactly the hash shown. A version whose
 * effective date is today becomes effective at once (superseding the previous
 * one); a later date waits for the server's timer.
 */
export async function approveVersion(
  actor: DocumentActor,
  input: { versionId: string; contentHash: string; password: string; effectiveDate: string },
  now = new Date(),
) {
  const today = todayUtc(now);
  if (input.effectiveDate < today)
    throw new UserFacingError("The effective date cannot be before today.", {
      kind: "invalid",
      field: "effectiveDate",
    });
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  return getDb().transaction(async (tx) => {
    const { version, document } = await loadVersion(tx, input.versionId);
    assertTransition(version, "approve", actor, document.type);
    const step = await findMyActiveStep(tx, version, actor.id, "approver");
    if (version.contentHash !== input.contentHash)
      throw new UserFacingError(
        "This version changed since you opened it. Nothing was signed; reload and check it again.",
      );
    // Segregation of duties: the author's own "authored" signature blocks their approval here.
    await applySignature(
      tx,
      {
        signer,
        recordType: "document_version",
        recordId: version.id,
        meaning: "approved",
        contentHash: input.contentHash,
      },
      now,
    );
    const at = now.toISOString();
    await tx
      .update(documentReviews)
      .set({ decision: "approved", decidedAt: at })
      .where(eq(documentReviews.id, step.id));
    const [approved] = await tx
      .update(documentVersions)
      .set({ status: "approved", approvedAt: at, effectiveDate: input.effectiveDate })
      .where(eq(documentVersions.id, version.id))
      .returning();
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.approved",
        recordType: "document_version",
        recordId: version.id,
        old: { status: "in_review" },
        new: {
          status: "approved",
          contentHash: input.contentHash,
          effectiveDate: input.effectiveDate,
        },
      },
      now,
    );
    const effectiveNow = input.effectiveDate <= today;
    if (effectiveNow) await makeEffectiveInTx(tx, actor, approved, now);
    const [owner] = await tx
      .select({ email: users.email })
      .from(users)
      .where(eq(users.id, document.ownerId));
    if (owner) {
      await enqueueEmail(
        tx,
        {
          to: owner.email,
          ...approvedEmail({
            documentId: document.id,
            number: document.number,
            title: document.title,
            version: version.version,
            by: actor.name,
            effectiveDate: input.effectiveDate,
            effectiveNow,
          }),
        },
        now,
      );
    }
    return { effectiveNow };
  });
}
