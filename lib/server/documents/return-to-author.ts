import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentReviews, documentVersions, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { sentBackEmail } from "@/templates/email/documents";
import { assertTransition, findMyActiveStep, loadVersion, type DocumentActor } from "./shared";

/**
 * A reviewer sends the version back, or the approver rejects it, with a
 * required comment: the version returns to draft for its author, the other
 * open steps of the round are withdrawn, and the author is e-mailed.
 */
export async function returnToAuthor(
  actor: DocumentActor,
  input: { versionId: string; comment: string; decision: "sent_back" | "rejected" },
  now = new Date(),
) {
  const rejecting = input.decision === "rejected";
  return getDb().transaction(async (tx) => {
    const { version, document } = await loadVersion(tx, input.versionId);
    assertTransition(version, rejecting ? "reject" : "send_back", actor, document.type);
    const step = await findMyActiveStep(tx, version, actor.id, rejecting ? "approver" : "reviewer");
    const at = now.toISOString();
    await tx
      .update(documentReviews)
      .set({ decision: input.decision, comment: input.comment, decidedAt: at })
      .where(eq(documentReviews.id, step.id));
    await tx
      .update(documentReviews)
      .set({ decision: "withdrawn", decidedAt: at })
      .where(
        and(
          eq(documentReviews.versionId, version.id),
          eq(documentReviews.round, version.reviewRound),
          isNull(documentReviews.decision),
        ),
      );
    // The frozen hash stays on its signatures; the draft has none until it is submitted again.
    await tx
      .update(documentVersions)
      .set({
        status: "draft",
        contentHash: null,
        lockVersion: version.lockVersion + 1,
        updatedAt: at,
      })
      .where(eq(documentVersions.id, version.id));
    const [owner] = await tx
      .select({ email: users.email })
      .from(users)
      .where(eq(users.id, document.ownerId));
    if (owner) {
      await enqueueEmail(
        tx,
        {
          to: owner.email,
          ...sentBackEmail({
            documentId: document.id,
            number: document.number,
            title: document.title,
            version: version.version,
            by: actor.name,
            comment: input.comment,
            rejected: rejecting,
          }),
        },
        now,
      );
    }
    await appendAudit(
      tx,
      actor,
      {
        eventType: rejecting ? "document.rejected" : "document.sent_back",
        recordType: "document_version",
        recordId: version.id,
        old: { status: "in_review", contentHash: version.contentHash },
        new: { status: "draft", round: version.reviewRound },
        reason: input.comment,
      },
      now,
    );
  });
}
