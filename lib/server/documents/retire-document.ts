import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentVersions } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertTransition, documentType, type DocumentActor } from "./shared";

/** Withdraws the effective version from use without a successor; it stays readable with its signatures. */
export async function retireDocument(
  actor: DocumentActor,
  input: { documentId: string; reason: string },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [effective] = await tx
      .select()
      .from(documentVersions)
      .where(
        and(
          eq(documentVersions.documentId, input.documentId),
          eq(documentVersions.status, "effective"),
        ),
      );
    if (!effective) throw new UserFacingError("Only an effective document can be retired.");
    assertTransition(effective, "retire", actor, await documentType(tx, input.documentId));
    await tx
      .update(documentVersions)
      .set({ status: "retired" })
      .where(eq(documentVersions.id, effective.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.retired",
        recordType: "document_version",
        recordId: effective.id,
        old: { status: "effective" },
        new: { status: "retired", version: effective.version },
        reason: input.reason,
      },
      now,
    );
  });
}
