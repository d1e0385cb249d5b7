import "server-only";
import { getDb } from "@/db/client";
import { evidenceFiles, nonconformanceFiles } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { checkUpload, FileCheckError } from "@/lib/evidence/files";
import { UserFacingError } from "@/lib/server/errors";
import { sha256OfBytes, uploadLimitBytes } from "@/lib/server/evidence/store-file";
import { getStore } from "@/lib/storage";
import { assertWorkable, loadNc } from "./shared";

/**
 * Stores a file for a nonconformance (a customer's concession letter, the evidence of an
 * effectiveness check) in the evidence store, checked as every upload is, and links it.
 */
export async function attachNcFile(
  actor: { id: string; name: string },
  input: { nonconformanceId: string; name: string; bytes: Uint8Array },
) {
  let checked;
  try {
    checked = checkUpload({ name: input.name, bytes: input.bytes, maxBytes: uploadLimitBytes() });
  } catch (error) {
    if (error instanceof FileCheckError)
      throw new UserFacingError(error.message, { kind: error.kind, field: "file" });
    throw error;
  }
  // Refused before a byte is stored when the NC is missing or finished.
  assertWorkable(await loadNc(getDb(), input.nonconformanceId));
  const sha256 = sha256OfBytes(input.bytes);
  const { created } = await getStore().put(sha256, input.bytes);
  return getDb().transaction(async (tx) => {
    const nc = await loadNc(tx, input.nonconformanceId);
    assertWorkable(nc);
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
    await tx.insert(nonconformanceFiles).values({ nonconformanceId: nc.id, fileId: file.id });
    await appendAudit(tx, actor, {
      eventType: "nonconformance.file_attached",
      recordType: "nonconformance",
      recordId: nc.id,
      new: { file: file.id, name: checked.name, sha256, storedNew: created },
    });
    return { id: file.id, name: checked.name, sha256 };
  });
}
