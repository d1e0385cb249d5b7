import "server-only";
import { and, desc, eq, inArray, isNotNull, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentReviews, documents, documentVersions } from "@/db/schema";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { formatDate } from "@/lib/format/date";

/** Reviews and approvals whose turn has come for the user, and the user's drafts that were returned. */
export const documentQueueProvider: QueueProvider = async (user) => {
  const db = getDb();
  const steps = await db
    .select({ review: documentReviews, version: documentVersions, document: documents })
    .from(documentReviews)
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
        eq(documentReviews.assigneeId, user.id),
        isNull(documentReviews.decision),
        isNotNull(documentReviews.activatedAt),
        eq(documentVersions.status, "in_review"),
      ),
    );
  const items: QueueItem[] = steps.map(({ review, version, document }) => ({
    id: `document-review:${review.id}`,
    kind: review.role === "approver" ? "Approval" : "Review",
    title: `${document.number} v${version.version} — ${document.title}`,
    detail: `${TYPE_LABELS[document.type]}, waiting for your ${review.role === "approver" ? "approval" : "review"} since ${formatDate(review.activatedAt!)}`,
    href: `/documents/${document.id}?version=${version.version}`,
    due: review.dueAt,
  }));

  const returned = await db
    .select({ version: documentVersions, document: documents })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(and(eq(documents.ownerId, user.id), eq(documentVersions.status, "draft")));
  const withRounds = returned.filter((r) => r.version.reviewRound > 0);
  if (withRounds.length) {
    const decisions = await db
      .select()
      .from(documentReviews)
      .where(
        and(
          inArray(
            documentReviews.versionId,
            withRounds.map((r) => r.version.id),
          ),
          inArray(documentReviews.decision, ["sent_back", "rejected"]),
        ),
      )
      .orderBy(desc(documentReviews.decidedAt));
    for (const { version, document } of withRounds) {
      const last = decisions.find(
        (d) => d.versionId === version.id && d.round === version.reviewRound,
      );
      if (!last) continue;
      items.push({
        id: `document-returned:${version.id}`,
        kind: last.decision === "rejected" ? "Rejected" : "Sent back",
        title: `${document.number} v${version.version} — ${document.title}`,
        detail: `Comment: ${last.comment ?? ""}`,
        href: `/documents/${document.id}?version=${version.version}`,
        due: null,
      });
    }
  }
  return { items };
};
