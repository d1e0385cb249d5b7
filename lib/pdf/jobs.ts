import { renderAuditPackPdf, type AuditPackPdfInput } from "./audit-pack-pdf";
import { renderDocumentPdf, type DocumentPdfInput } from "./document-pdf";

/** What the PDF worker process is asked to render; plain data, so it crosses the process boundary. */
export type PdfJob =
  { kind: "document"; input: DocumentPdfInput } | { kind: "audit-pack"; input: AuditPackPdfInput };

export function renderJob(job: PdfJob): Promise<Buffer> {
  return job.kind === "document" ? renderDocumentPdf(job.input) : renderAuditPackPdf(job.input);
}
