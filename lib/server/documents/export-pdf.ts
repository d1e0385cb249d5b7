import "server-only";
import { getDb } from "@/db/client";
import { appendAudit } from "@/lib/audit";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import { renderPdf } from "@/lib/server/pdf/render-pdf";
import { loadLetterhead } from "@/lib/server/plant/letterhead";
import { getDocument, getVersion } from "./queries";
import { hashContent, type DocumentActor } from "./shared";

/** Renders a version to PDF and records the export in the audit trail. */
export async function exportVersionPdf(
  actor: DocumentActor,
  input: { documentId: string; version: number },
  now = new Date(),
) {
  const document = await getDocument(input.documentId);
  const version = document && (await getVersion(input.documentId, input.version));
  if (!document || !version) return null;
  // The printout shows the signatures that bind to this content; earlier submissions' stay on screen.
  const signatures = version.signatures.filter((sig) => sig.contentHash === version.contentHash);
  const bytes = await renderPdf({
    kind: "document",
    input: {
      number: document.number,
      title: document.title,
      typeLabel: TYPE_LABELS[document.type],
      version: version.version,
      status: version.status,
      effectiveDate: version.effectiveDate,
      contentHash: version.contentHash,
      content: version.content,
      signatures,
      printedAt: now.toISOString(),
      printedBy: actor.name,
      // The worker has no database: the header's company and site travel in the job.
      letterhead: await loadLetterhead(getDb(), document.systemId),
    },
  });
  await getDb().transaction((tx) =>
    appendAudit(
      tx,
      actor,
      {
        eventType: "document.exported",
        recordType: "document_version",
        recordId: version.id,
        new: {
          format: "pdf",
          number: document.number,
          version: version.version,
          status: version.status,
          contentHash: version.contentHash ?? hashContent(version.content),
          bytes: bytes.length,
        },
      },
      now,
    ),
  );
  return { bytes, filename: `${document.number}-v${version.version}.pdf` };
}
