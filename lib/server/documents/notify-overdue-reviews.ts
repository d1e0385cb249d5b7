// No "server-only" marker: the server's timer (instrumentation.ts) imports this too.
import { and, eq, isNotNull, isNull, lt } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentReviews, documents, documentVersions, users } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { reviewOverdueEmail } from "@/templates/email/documents";

/**
 * One reminder per open review or approval step past its due date (by default
 * REVIEW_OVERDUE_DAYS after it opened). Run by the server's timer; returns how
 * many reminders were queued.
 */
export async function notifyOverdueReviews(now = new Date()) {
  const db = getDb();
  const overdue = await db
    .select({
      review: documentReviews,
      email: users.email,
      version: documentVersions,
      document: documents,
    })
    .from(documentReviews)
    .innerJoin(users, eq(users.id, documentReviews.assigneeId))
    .innerJoin(
      documentVersions,
      and(
        eq(documentVersions.id, documentReviews.versionId),
        eq(documentVersions.reviewRound, documentReviews.round),
      ),
    )
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(
      and(
        isNull(documentReviews.decision),
        isNotNull(documentReviews.activatedAt),
        isNull(documentReviews.overdueNotifiedAt),
        lt(documentReviews.dueAt, now.toISOString()),
        eq(documentVersions.status, "in_review"),
      ),
    );
  for (const { review, email, version, document } of overdue) {
    await db.transaction(async (tx) => {
      await tx
        .update(documentReviews)
        .set({ overdueNotifiedAt: now.toISOString() })
        .where(eq(documentReviews.id, review.id));
      await enqueueEmail(
        tx,
        {
          to: email,
          ...reviewOverdueEmail({
            documentId: document.id,
            number: document.number,
            title: document.title,
            version: version.version,
            role: review.role,
            due: review.dueAt!,
          }),
        },
        now,
      );
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "document.review_overdue",
          recordType: "document_review",
          recordId: review.id,
          new: { assignee: review.assigneeId, due: review.dueAt, notifiedAt: now.toISOString() },
        },
        now,
      );
    });
  }
  return overdue.length;
}
