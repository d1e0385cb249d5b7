import "server-only";
import { getDb } from "@/db/client";
import { evidenceFiles, type EvidenceFileKind } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { checkUpload, FileCheckError, type CheckedFile } from "@/lib/evidence/files";
import { UserFacingError } from "@/lib/server/errors";
import { sha256OfBytes, uploadLimitBytes } from "./store-file";
import { getStore } from "@/lib/storage";

/**
 * Stores a file bound to no run (a check photo, a customer's letter, a calibration certificate)
 * under its SHA-256, checked as every upload is; the record saved afterwards cites its id, so a
 * reader downloads exactly these bytes, re-hashed on the way out.
 */
export async function storeLooseFile(
  actor: { id: string; name: string },
  input: {
    name: string;
    bytes: Uint8Array;
    kind: EvidenceFileKind;
    eventType:
      | "evidence_file.check_photo_uploaded"
      | "evidence_file.customer_letter_uploaded"
      | "evidence_file.certificate_uploaded"
      | "evidence_file.spec_source_uploaded";
    /** A further refusal for this use (a photo must be an image), as a message beside the file. */
    refuse?: (checked: CheckedFile) => string | null;
  },
) {
  let checked;
  try {
    checked = checkUpload({ name: input.name, bytes: input.bytes, maxBytes: uploadLimitBytes() });
  } catch (error) {
    if (error instanceof FileCheckError)
      throw new UserFacingError(error.message, { kind: error.kind, field: "file" });
    throw error;
  }
  const refused = input.refuse?.(checked);
  if (refused) throw new UserFacingError(refused, { kind: "invalid", field: "file" });
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
        kind: input.kind,
        uploadedBy: actor.id,
      })
      .returning();
    await appendAudit(tx, actor, {
      eventType: input.eventType,
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
