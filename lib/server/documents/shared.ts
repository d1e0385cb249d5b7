import "server-only";
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
import type { Tx } from "@/db/client";
import {
  documentReviews,
  documents,
  documentVersions,
  users,
  type Document,
  type DocumentVersion,
  type Role,
} from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { checkTransition, type DocumentAction } from "@/lib/documents/lifecycle";
import type { RichDoc } from "@/lib/documents/rich-text";
import { enqueueEmail } from "@/lib/email/outbox";
import { env } from "@/lib/env";
import { UserFacingError } from "@/lib/server/errors";
import { reviewRequestedEmail } from "@/templates/email/documents";

/** Who acts on a document: the signed-in user with the roles the lifecycle checks. */
export interface DocumentActor {
  id: string;
  name: string;
  roles: readonly Role[];
}

/** The content hash every signature on a version binds to: SHA-256 of its canonical JSON. */
export function hashContent(content: unknown): string {
  return sha256Hex(canonicalJson(content));
}

export async function loadVersion(
  tx: Tx,
  versionId: string,
): Promise<{ version: DocumentVersion & { content: RichDoc }; document: Document }> {
  const [row] = await tx
    .select({ version: documentVersions, document: documents })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(eq(documentVersions.id, versionId));
  if (!row)
    throw new UserFacingError("This document version does not exist.", { kind: "not_found" });
  return { version: row.version as DocumentVersion & { content: RichDoc }, document: row.document };
}

/** The document's type, for steps that find the version by document rather than through loadVersion. */
export async function documentType(tx: Tx, documentId: string): Promise<Document["type"]> {
  const [row] = await tx
    .select({ type: documents.type })
    .from(documents)
    .where(eq(documents.id, documentId));
  if (!row) throw new UserFacingError("This document does not exist.", { kind: "not_found" });
  return row.type;
}

/** Throws the lifecycle's reason when this step is not permitted now (21 CFR 11.10(f)); the type decides whether the document moves on its own. */
export function assertTransition(
  version: DocumentVersion,
  action: DocumentAction,
  actor: DocumentActor,
  type: Document["type"],
) {
  const check = checkTransition(version.status, action, actor.roles, type);
  if (!check.ok) throw new UserFacingError(check.reason);
  return check.to;
}

/** The actor's open, active step on this version's current round, if any. */
export async function findMyActiveStep(
  tx: Tx,
  version: DocumentVersion,
  actorId: string,
  role: "reviewer" | "approver",
) {
  const [step] = await tx
    .select()
    .from(documentReviews)
    .where(
      and(
        eq(documentReviews.versionId, version.id),
        eq(documentReviews.round, version.reviewRound),
        eq(documentReviews.assigneeId, actorId),
        eq(documentReviews.role, role),
        isNull(documentReviews.decision),
      ),
    );
  if (!step || !step.activatedAt) {
    throw new UserFacingError(
      role === "approver"
        ? "This version is not waiting for your approval."
        : "This version is not waiting for your review.",
    );
  }
  return step;
}

const addDays = (now: Date, days: number) =>
  new Date(now.getTime() + days * 86_400_000).toISOString();

/**
 * Opens the next step of the routing once every active step is decided, and
 * queues the "review requested" e-mail to each person whose turn it now is.
 * Returns the role of the step opened, or null when none is left.
 */
export async function activateNextStep(
  tx: Tx,
  version: DocumentVersion,
  document: Document,
  authorName: string,
  now: Date,
) {
  const rows = await tx
    .select({ review: documentReviews, email: users.email })
    .from(documentReviews)
    .innerJoin(users, eq(users.id, documentReviews.assigneeId))
    .where(
      and(
        eq(documentReviews.versionId, version.id),
        eq(documentReviews.round, version.reviewRound),
      ),
    )
    .orderBy(asc(documentReviews.step));
  const open = rows.filter((r) => r.review.decision === null);
  if (open.some((r) => r.review.activatedAt !== null)) return null;
  if (open.length === 0) return null;
  const step = open[0].review.step;
  const next = open.filter((r) => r.review.step === step);
  const at = now.toISOString();
  for (const { review, email } of next) {
    const dueAt = review.dueAt ?? addDays(now, env().REVIEW_OVERDUE_DAYS);
    await tx
      .update(documentReviews)
      .set({ activatedAt: at, dueAt })
      .where(inArray(documentReviews.id, [review.id]));
    await enqueueEmail(
      tx,
      {
        to: email,
        ...reviewRequestedEmail({
          documentId: document.id,
          number: document.number,
          title: document.title,
          version: version.version,
          role: review.role,
          author: authorName,
          due: dueAt,
        }),
      },
      now,
    );
  }
  return next[0].review.role;
}
