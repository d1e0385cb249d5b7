import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { evidenceFiles } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { getStore } from "@/lib/storage";
import { sha256OfBytes } from "./store-file";

export type FileRead =
  | { ok: true; bytes: Uint8Array; name: string; mimeType: string }
  | { ok: false; status: 404 | 409; message: string };

/**
 * Reads a file for download, re-hashing the bytes: a mismatch (or bytes gone
 * missing) is audited and reported, never served. Every download is audited.
 */
export async function readEvidenceFile(actor: AuditActor, fileId: string): Promise<FileRead> {
  const db = getDb();
  const [file] = await db.select().from(evidenceFiles).where(eq(evidenceFiles.id, fileId));
  if (!file) return { ok: false, status: 404, message: "No such file." };
  const bytes = await getStore().get(file.sha256);
  const actual = bytes ? sha256OfBytes(bytes) : null;
  if (!bytes || actual !== file.sha256) {
    await db.transaction((tx) =>
      appendAudit(tx, actor, {
        eventType: "evidence_file.integrity_failed",
        recordType: "evidence_file",
        recordId: file.id,
        new: { expectedSha256: file.sha256, actualSha256: actual, name: file.originalName },
      }),
    );
    return {
      ok: false,
      status: 409,
      message: bytes
        ? `The stored bytes of "${file.originalName}" no longer match their SHA-256 (${file.sha256}). The file was not served; the failed check is in the audit trail. Tell the administrator.`
        : `The stored bytes of "${file.originalName}" are missing. The failed check is in the audit trail. Tell the administrator.`,
    };
  }
  await db.transaction((tx) =>
    appendAudit(tx, actor, {
      eventType: "evidence_file.downloaded",
      recordType: "evidence_file",
      recordId: file.id,
      new: { sha256: file.sha256, name: file.originalName },
    }),
  );
  return { ok: true, bytes, name: file.originalName, mimeType: file.mimeType };
}
