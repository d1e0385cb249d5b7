import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentVersions } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { RichDoc } from "@/lib/documents/rich-text";
import { formatDateTime } from "@/lib/format/date";
import { UserFacingError } from "@/lib/server/errors";
import { assertTransition, hashContent, loadVersion, type DocumentActor } from "./shared";

const formatTime = (iso: string | null) =>
  iso ? formatDateTime(iso, { seconds: true }).slice(11) : "a moment ago";

export type SaveDraftResult =
  | { ok: true; lockVersion: number; savedAt: string }
  | {
      ok: false;
      conflict: true;
      message: string;
      currentLockVersion: number;
      savedAt: string | null;
    };

/**
 * Saves a draft only if nobody saved it since the caller read it (optimistic
 * concurrency on lock_version). A stale save is refused with the current
 * counter, never applied over the other person's text.
 */
export async function saveDraft(
  actor: DocumentActor,
  input: { versionId: string; lockVersion: number; content: RichDoc; overwrite: boolean },
  now = new Date(),
): Promise<SaveDraftResult> {
  return getDb().transaction(async (tx) => {
    const { version, document } = await loadVersion(tx, input.versionId);
    assertTransition(version, "edit", actor, document.type);
    if (version.lockVersion !== input.lockVersion) {
      return {
        ok: false,
        conflict: true,
        // Asked to save over a text that has since been saved again: say so, with the newest
        // counter, so the next press replaces the text the author has now been told about.
        message: input.overwrite
          ? `They saved again at ${formatTime(version.updatedAt)}, after the text you chose to replace. Nothing was saved: press “Save my text over theirs” again to replace their newest text, or load theirs.`
          : "Someone saved this draft after you opened it. Your text is kept here and was not saved: load their version, or save yours over it on purpose.",
        currentLockVersion: version.lockVersion,
        savedAt: version.updatedAt,
      };
    }
    const savedAt = now.toISOString();
    const updated = await tx
      .update(documentVersions)
      .set({ content: input.content, lockVersion: version.lockVersion + 1, updatedAt: savedAt })
      .where(
        and(
          eq(documentVersions.id, version.id),
          eq(documentVersions.lockVersion, input.lockVersion),
          eq(documentVersions.status, "draft"),
        ),
      )
      .returning({ lockVersion: documentVersions.lockVersion });
    if (updated.length !== 1)
      throw new UserFacingError("The draft changed while saving. Nothing was saved; try again.");
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.edited",
        recordType: "document_version",
        recordId: version.id,
        old: { contentHash: hashContent(version.content), lockVersion: version.lockVersion },
        new: {
          contentHash: hashContent(input.content),
          lockVersion: updated[0].lockVersion,
          ...(input.overwrite ? { savedOverNewer: true } : {}),
        },
        // Once a document was approved, every later edit carries the reason for its new version.
        reason: version.changeReason,
      },
      now,
    );
    return { ok: true, lockVersion: updated[0].lockVersion, savedAt };
  });
}
