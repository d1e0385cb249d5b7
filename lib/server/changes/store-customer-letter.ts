import "server-only";
import { getDb } from "@/db/client";
import { evidenceFiles } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { checkUpload, FileCheckError } from "@/lib/evidence/files";
import { UserFacingError } from "@/lib/server/errors";
import { sha256OfBytes, uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { getStore } from "@/lib/storage";

/**
 * Stores the customer's letter on a change under its SHA-256, as an evidence file bound to no
 * run; the decision recorded with it cites the file's id, so an auditor downloads exactly the
 * letter, re-hashed on the way out.
 */
export async function storeCustomerLetter(
  actor: { id: string; name: string },
  input: { name: string; bytes: Uint8Array },
) {
  let checked;
  try {
    checked = checkUpload({ name: input.name, bytes: input.bytes, maxBytes: uploadLimitBytes() });
  } catch (error) {
    if (error instanceof FileCheckError)
      throw new UserFacingError(error.message, { kind: error.kind, field: "file" });
    throw error;
  }
  const sha256 = sha256OfBytes(input.bytes);
  const { created } = await getStore().put(sha256, input.bytes);
  return getDb().transaction(async (tx) => {
    const [file] = await tx
      .insert(evidenceFiles)
      .values({
        runId: null,
        sha256,
        originalName: checked.name,
        mimeType: checked.mime,
        sizeBytes: input.bytes.byteLength,
        kind: "other",
        uploadedBy: actor.id,
      })
      .returning();
    await appendAudit(tx, actor, {
      eventType: "evidence_file.customer_letter_uploaded",
      recordType: "evidence_file",
      recordId: file.id,
      new: {
        sha256,
        name: checked.name,
        mimeType: checked.mime,
        sizeBytes: input.bytes.byteLength,
        storedNew: created,
      },
    });
    return { id: file.id, name: checked.name, sha256 };
  });
}
