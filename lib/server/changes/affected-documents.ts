import "server-only";
import { and, asc, eq, inArray, ne } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { changeAffectedDocuments, changeRequests, documents, documentVersions } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { revisionSince, type AffectedDocument } from "@/lib/changes/affected-documents";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import { UserFacingError } from "@/lib/server/errors";

async function openChange(db: Executor, changeRequestId: string) {
  const [cr] = await db.select().from(changeRequests).where(eq(changeRequests.id, changeRequestId));
  if (!cr) throw new UserFacingError("That change request does not exist.", { kind: "not_found" });
  if (!OPEN_STATUSES.includes(cr.status))
    throw new UserFacingError(
      "This change request is no longer open: its list of affected documents is closed.",
    );
  return cr;
}

/** Names a controlled document from the register as touched by the change. */
export async function addAffectedDocument(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string; documentId: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const cr = await openChange(tx, input.changeRequestId);
    const [doc] = await tx.select().from(documents).where(eq(documents.id, input.documentId));
    // A change's own narrative is revised with the change itself, not listed beside it.
    if (!doc || doc.type === "change_narrative")
      throw new UserFacingError("Choose a controlled document from the register.", {
        kind: "invalid",
        field: "documentId",
      });
    const [listed] = await tx
      .select()
      .from(changeAffectedDocuments)
      .where(
        and(
          eq(changeAffectedDocuments.changeRequestId, cr.id),
          eq(changeAffectedDocuments.documentId, doc.id),
        ),
      );
    if (listed)
      throw new UserFacingError(`${doc.number} is already listed on this change.`, {
        kind: "conflict",
        field: "documentId",
      });
    const [row] = await tx
      .insert(changeAffectedDocuments)
      .values({
        changeRequestId: cr.id,
        documentId: doc.id,
        addedBy: actor.id,
        addedAt: now.toISOString(),
      })
      .returning();
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.document_listed",
        recordType: "change_request",
        recordId: cr.id,
        new: { document: doc.number, title: doc.title, entry: row.id },
      },
      now,
    );
  });
}

/** Records, with its reason, that a listed document needs no revision for this change. */
export async function confirmDocumentUnaffected(
  actor: AuditActor & { id: string },
  input: { changeRequestId: string; documentId: string; reason: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const cr = await openChange(tx, input.changeRequestId);
    const [row] = await tx
      .select({ entry: changeAffectedDocuments, doc: documents })
      .from(changeAffectedDocuments)
      .innerJoin(documents, eq(documents.id, changeAffectedDocuments.documentId))
      .where(
        and(
          eq(changeAffectedDocuments.changeRequestId, cr.id),
          eq(changeAffectedDocuments.documentId, input.documentId),
        ),
      );
    if (!row)
      throw new UserFacingError("That document is not listed on this change.", {
        kind: "not_found",
        field: "documentId",
      });
    await tx
      .update(changeAffectedDocuments)
      .set({
        unaffectedReason: input.reason,
        confirmedBy: actor.id,
        confirmedAt: now.toISOString(),
      })
      .where(eq(changeAffectedDocuments.id, row.entry.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.document_confirmed_unaffected",
        recordType: "change_request",
        recordId: cr.id,
        old: { unaffectedReason: row.entry.unaffectedReason },
        new: { document: row.doc.number, unaffectedReason: input.reason },
      },
      now,
    );
  });
}

/** The listed documents of a change, each with the revision that answers it (if any). */
export async function loadAffectedDocuments(
  db: Executor,
  cr: { id: string; createdAt: string },
): Promise<(AffectedDocument & { documentId: string })[]> {
  const rows = await db
    .select({ entry: changeAffectedDocuments, doc: documents })
    .from(changeAffectedDocuments)
    .innerJoin(documents, eq(documents.id, changeAffectedDocuments.documentId))
    .where(eq(changeAffectedDocuments.changeRequestId, cr.id))
    .orderBy(asc(documents.number));
  const versions = rows.length
    ? await db
        .select()
        .from(documentVersions)
        .where(
          inArray(
            documentVersions.documentId,
            rows.map((r) => r.doc.id),
          ),
        )
    : [];
  return rows.map(({ entry, doc }) => ({
    documentId: doc.id,
    number: doc.number,
    title: doc.title,
    unaffectedReason: entry.unaffectedReason,
    revisedBy: revisionSince(
      versions.filter((v) => v.documentId === doc.id),
      cr.createdAt,
    ),
  }));
}

/** The controlled documents a change may list: the register, without change narratives. */
export async function listControlledDocuments(db: Executor) {
  return db
    .select({ id: documents.id, number: documents.number, title: documents.title })
    .from(documents)
    .where(ne(documents.type, "change_narrative"))
    .orderBy(asc(documents.number));
}
