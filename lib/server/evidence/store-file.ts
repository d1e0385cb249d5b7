import "server-only";
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { evidenceFiles, type EvidenceFileKind } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { checkUpload, FileCheckError } from "@/lib/evidence/files";
import { env } from "@/lib/env";
import { formatDateTime } from "@/lib/format/date";
import { UserFacingError } from "@/lib/server/errors";
import { getStore } from "@/lib/storage";
import { requireOpenRun } from "./guards";
import { getRunRow } from "./run-content";
import { refreshOutcome } from "./refresh-outcome";

export function uploadLimitBytes() {
  return Math.round(env().UPLOAD_MAX_MB * 1024 * 1024);
}

export function sha256OfBytes(bytes: Uint8Array) {
  return createHash("sha256").update(bytes).digest("hex");
}

/**
 * Checks an uploaded file completely before storing a byte, stores it under its
 * SHA-256 (once, however often it is uploaded), and links it to an open run in
 * one audited transaction — once per run: the same bytes again are refused.
 */
export async function storeEvidenceFile(
  actor: { id: string; name: string },
  input: {
    runId: string;
    name: string;
    bytes: Uint8Array;
    kind: EvidenceFileKind;
    sampleLabel?: string | null;
  },
) {
  const run = await getRunRow(getDb(), input.runId);
  if (!run) throw new UserFacingError("This test run does not exist.", { kind: "not_found" });
  if (run.status !== "open")
    throw new UserFacingError(
      `This run is ${run.status} and locked; files can be added only while it is open.`,
      { kind: "locked" },
    );
  let checked;
  try {
    checked = checkUpload({ name: input.name, bytes: input.bytes, maxBytes: uploadLimitBytes() });
  } catch (error) {
    if (error instanceof FileCheckError)
      throw new UserFacingError(error.message, { kind: error.kind, field: "file" });
    throw error;
  }
  if (
    (input.kind === "photo" || input.kind === "membrane_image") &&
    checked.type !== "png" &&
    checked.type !== "jpeg"
  ) {
    throw new UserFacingError("Photos and membrane images must be PNG or JPEG.", {
      kind: "invalid",
      field: "kind",
    });
  }
  const sha256 = sha256OfBytes(input.bytes);
  const { created } = await getStore().put(sha256, input.bytes);
  const row = await getDb().transaction(async (tx) => {
    const open = await requireOpenRun(tx, input.runId);
    // The same bytes attached twice would count twice as evidence: once per run, whatever the name.
    const [twin] = await tx
      .select({ name: evidenceFiles.originalName, at: evidenceFiles.uploadedAt })
      .from(evidenceFiles)
      .where(and(eq(evidenceFiles.runId, open.id), eq(evidenceFiles.sha256, sha256)));
    if (twin) {
      throw new UserFacingError(
        `This file is already attached to ${open.number} as "${twin.name}" (uploaded ${formatDateTime(twin.at)}); it counts once. Nothing was added.`,
        {
          kind: "conflict",
          field: "file",
        },
      );
    }
    const [file] = await tx
      .insert(evidenceFiles)
      .values({
        runId: open.id,
        sha256,
        originalName: checked.name,
        mimeType: checked.mime,
        sizeBytes: input.bytes.byteLength,
        kind: input.kind,
        sampleLabel: input.sampleLabel ?? null,
        uploadedBy: actor.id,
      })
      .returning();
    await refreshOutcome(tx, open);
    await appendAudit(tx, actor as AuditActor, {
      eventType: "evidence_file.uploaded",
      recordType: "evidence_file",
      recordId: file.id,
      new: {
        run: `${open.number} rev ${open.revision}`,
        runId: open.id,
        sha256,
        name: checked.name,
        mimeType: checked.mime,
        sizeBytes: input.bytes.byteLength,
        kind: input.kind,
        storedNew: created,
      },
    });
    return file;
  });
  return { file: row, created };
}
