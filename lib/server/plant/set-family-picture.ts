import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { evidenceFiles, partFamilies, partFamilyPictures } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { pictureProblem, sniffPicture } from "@/lib/parts/picture";
import { UserFacingError } from "@/lib/server/errors";
import { sha256OfBytes } from "@/lib/server/evidence/store-file";
import { getStore } from "@/lib/storage";

/**
 * Sets a part family's picture: the bytes are checked (PNG or JPEG by content, size limit),
 * stored under their SHA-256, and the family points at the new file in one audited transaction.
 */
export async function setFamilyPicture(
  actor: { id: string; name: string },
  input: { partFamilyId: string; name: string; bytes: Uint8Array },
) {
  const problem = pictureProblem(input.bytes);
  if (problem)
    throw new UserFacingError(problem, {
      kind: input.bytes.byteLength > 0 && sniffPicture(input.bytes) ? "too_large" : "invalid",
      field: "file",
    });
  const mimeType = sniffPicture(input.bytes)!;
  const [family] = await getDb()
    .select({ id: partFamilies.id })
    .from(partFamilies)
    .where(eq(partFamilies.id, input.partFamilyId));
  if (!family) throw new UserFacingError("That part family does not exist.", { kind: "not_found" });
  const sha256 = sha256OfBytes(input.bytes);
  // Stored before the transaction: a blob no row points at is harmless, a row without its blob is not.
  await getStore().put(sha256, input.bytes);
  const name = input.name.replace(/[\\/\x00-\x1f]/g, "_").slice(0, 200) || "picture";
  return getDb().transaction(async (tx) => {
    const [file] = await tx
      .insert(evidenceFiles)
      .values({
        runId: null,
        sha256,
        originalName: name,
        mimeType,
        sizeBytes: input.bytes.byteLength,
        kind: "photo",
        uploadedBy: actor.id,
      })
      .returning();
    const [before] = await tx
      .select({ fileId: partFamilyPictures.fileId, sha256: evidenceFiles.sha256 })
      .from(partFamilyPictures)
      .innerJoin(evidenceFiles, eq(evidenceFiles.id, partFamilyPictures.fileId))
      .where(eq(partFamilyPictures.partFamilyId, family.id));
    const at = new Date().toISOString();
    await tx
      .insert(partFamilyPictures)
      .values({ partFamilyId: family.id, fileId: file.id, uploadedBy: actor.id, uploadedAt: at })
      .onConflictDoUpdate({
        target: partFamilyPictures.partFamilyId,
        set: { fileId: file.id, uploadedBy: actor.id, uploadedAt: at },
      });
    await appendAudit(tx, actor, {
      eventType: "part_family.picture_set",
      recordType: "part_family",
      recordId: family.id,
      old: before ?? null,
      new: { fileId: file.id, sha256, name, mimeType, sizeBytes: input.bytes.byteLength },
    });
    return { fileId: file.id, sha256 };
  });
}

/** The picture's bytes for the family page, re-hashed: a damaged file is not shown. */
export async function readFamilyPicture(partFamilyId: string) {
  const [row] = await getDb()
    .select({ sha256: evidenceFiles.sha256, mimeType: evidenceFiles.mimeType })
    .from(partFamilyPictures)
    .innerJoin(evidenceFiles, eq(evidenceFiles.id, partFamilyPictures.fileId))
    .where(eq(partFamilyPictures.partFamilyId, partFamilyId));
  if (!row) return null;
  const bytes = await getStore().get(row.sha256);
  if (!bytes || sha256OfBytes(bytes) !== row.sha256) return null;
  return { bytes, mimeType: row.mimeType, sha256: row.sha256 };
}
