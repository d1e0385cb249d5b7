import "server-only";
import { strToU8, zipSync } from "fflate";
import { getDb } from "@/db/client";
import { appendAudit, sha256Hex } from "@/lib/audit";
import { renderPdf } from "@/lib/server/pdf/render-pdf";
import { readEvidenceFile } from "@/lib/server/evidence/read-file";
import { loadLetterhead } from "@/lib/server/plant/letterhead";
import { loadAuditPack } from "./audit-pack";

type Actor = { id: string; name: string };

/** A name safe in any archive tool: no folders, no control characters. */
function safeName(name: string) {
  return name.replace(/[\\/:*?"<>|\u0000-\u001f]/g, "_").slice(0, 120) || "file";
}

/**
 * Renders a change request's audit pack; as "zip", adds every evidence file (read
 * back and re-hashed, as any download) and a SHA256SUMS list. The export is audited
 * with the PDF's own hash, so a printed pack can be matched to its export.
 */
export async function exportAuditPack(
  actor: Actor,
  input: { changeRequestId: string; format: "pdf" | "zip" },
  now = new Date(),
) {
  const db = getDb();
  const pack = await loadAuditPack(db, input.changeRequestId);
  const letterhead = await loadLetterhead(db, pack.recipe.systemId);
  const pdf = await renderPdf({
    kind: "audit-pack",
    input: { pack, printedAt: now.toISOString(), printedBy: actor.name, letterhead },
  });
  const base = `audit-pack-${pack.cr.number}`;
  let body: Uint8Array = pdf;
  const included: string[] = [];
  const problems: string[] = [];
  if (input.format === "zip") {
    const entries: Record<string, Uint8Array> = { [`${base}.pdf`]: pdf };
    const sums = [`${sha256Hex(pdf)}  ${base}.pdf`];
    for (const run of pack.evidence) {
      for (const file of run.files) {
        const read = await readEvidenceFile(actor, file.id);
        if (!read.ok) {
          problems.push(`${run.number}: ${read.message}`);
          continue;
        }
        const path = `evidence/${run.number}/${file.sha256.slice(0, 12)}-${safeName(file.originalName)}`;
        entries[path] = read.bytes;
        sums.push(`${file.sha256}  ${path}`);
        included.push(path);
      }
    }
    // The newest checkpoint file as stored, so the auditor can check its signature with the public key.
    if (pack.checkpoints.newest)
      entries["audit-checkpoint.json"] = strToU8(
        JSON.stringify(pack.checkpoints.newest, null, 2) + "\n",
      );
    entries["SHA256SUMS"] = strToU8(sums.join("\n") + "\n");
    entries["README.txt"] = strToU8(
      [
        `Audit pack of ${pack.cr.number}, exported ${now.toISOString()} by ${actor.name}.`,
        "",
        `${base}.pdf lists the record, its signatures and the SHA-256 of every evidence file.`,
        "Check the files with: sha256sum -c SHA256SUMS",
        ...(pack.checkpoints.newest
          ? [
              "",
              "audit-checkpoint.json is the newest signed checkpoint of the audit trail (Ed25519 over its other fields as canonical JSON); the PDF says whether the trail still matches it.",
            ]
          : []),
        ...(problems.length
          ? ["", "Files not included (their stored bytes failed the check):", ...problems]
          : []),
        "",
      ].join("\n"),
    );
    // Fixed timestamps keep the archive's bytes a function of its content.
    body = zipSync(entries, { level: 6, mtime: new Date("2000-01-01T00:00:00Z") });
  }
  await db.transaction((tx) =>
    appendAudit(
      tx,
      actor,
      {
        eventType: "audit_pack.exported",
        recordType: "change_request",
        recordId: pack.cr.id,
        new: {
          number: pack.cr.number,
          format: input.format,
          pdfSha256: sha256Hex(pdf),
          bytes: body.length,
          files: included.length,
          ...(problems.length ? { filesRefused: problems.length } : {}),
        },
      },
      now,
    ),
  );
  return {
    bytes: body,
    filename: `${base}.${input.format}`,
    contentType: input.format === "zip" ? "application/zip" : "application/pdf",
    pack,
  };
}
