import "server-only";
import { and, desc, eq, inArray, isNotNull, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentReviews, documents, documentVersions } from "@/db/schema";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { formatDate } from "@/lib/format/date";

// The queue names a version and links to it: the content (the document itself) is never read here.
const versionFields = {
  id: documentVersions.id,
  version: documentVersions.version,
  reviewRound: documentVersions.reviewRound,
};
const documentFields = {
  id: documents.id,
  number: documents.number,
  title: documents.title,
  type: documents.type,
};

/**
 * The provider's two reads: review steps waiting on the user, and the user's drafts. Exported so
 * a test can read their query plans (a plant's library is thousands of effective versions; the
 * drafts are found through the status index, never by scanning every version's content).
 */
export function documentQueueQueries(userId: string) {
  const db = getDb();
  const steps = db
    .select({ review: documentReviews, version: versionFields, document: documentFields })
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
        eq(documentReviews.assigneeId, userId),
        isNull(documentReviews.decision),
        isNotNull(documentReviews.activatedAt),
        eq(documentVersions.status, "in_review"),
      ),
    );
  // The unary + keeps SQLite from walking every document and looking up its versions (its
  // statistics see a status cover a third of the versions): the drafts are read first, by status.
  const returned = db
    .select({ version: versionFields, document: documentFields })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, sql`+${documentVersions.documentId}`))
    .where(and(eq(documents.ownerId, userId), eq(documentVersions.status, "draft")));
  return { steps, returned };
}

/** Reviews and approvals whose turn has come for the user, and the user's drafts that were returned. */
export const documentQueueProvider: QueueProvider = async (user) => {
  const db = getDb();
  const queries = documentQueueQueries(user.id);
  const steps = await queries.steps;
  const items: QueueItem[] = steps.map(({ review, version, document }) => ({
    id: `document-review:${review.id}`,
    kind: review.role === "approver" ? "Approval" : "Review",
    title: `${document.number} v${version.version} — ${document.title}`,
    detail: `${TYPE_LABELS[document.type]}, waiting for your ${review.role === "approver" ? "approval" : "review"} since ${formatDate(review.activatedAt!)}`,
    href: `/documents/${document.id}?version=${version.version}`,
    due: review.dueAt,
  }));

  const returned = await queries.returned;
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
