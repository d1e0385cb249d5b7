import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentVersions } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertTransition, documentType, hashContent, type DocumentActor } from "./shared";

/**
 * Editing an approved text starts a new draft version copied from the latest
 * one; the old version and its signatures stay as they are. The reason is kept
 * with the version and on every edit of it.
 */
export async function startNewVersion(
  actor: DocumentActor,
  input: { documentId: string; reason: string },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [latest] = await tx
      .select()
      .from(documentVersions)
      .where(eq(documentVersions.documentId, input.documentId))
      .orderBy(desc(documentVersions.version))
      .limit(1);
    if (!latest) throw new UserFacingError("This document does not exist.", { kind: "not_found" });
    assertTransition(latest, "new_version", actor, await documentType(tx, input.documentId));
    const [created] = await tx
      .insert(documentVersions)
      .values({
        documentId: input.documentId,
        version: latest.version + 1,
        content: latest.content,
        createdBy: actor.id,
        changeReason: input.reason,
      })
      .returning();
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.version_started",
        recordType: "document_version",
        recordId: created.id,
        new: {
          version: created.version,
          from: latest.version,
          contentHash: hashContent(latest.content),
        },
        reason: input.reason,
      },
      now,
    );
    return { version: created.version };
  });
}
