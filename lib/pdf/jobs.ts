import { renderAuditPackPdf, type AuditPackPdfInput } from "./audit-pack-pdf";
import { renderDocumentPdf, type DocumentPdfInput } from "./document-pdf";
import { renderLotHistoryPdf, type LotHistoryPdfInput } from "./lot-history-pdf";

/** What the PDF worker process is asked to render; plain data, so it crosses the process boundary. */
export type PdfJob =
  | { kind: "document"; input: DocumentPdfInput }
  | { kind: "audit-pack"; input: AuditPackPdfInput }
  | { kind: "lot-history"; input: LotHistoryPdfInput };

export function renderJob(job: PdfJob): Promise<Buffer> {
  switch (job.kind) {
    case "document":
      return renderDocumentPdf(job.input);
    case "audit-pack":
      return renderAuditPackPdf(job.input);
    case "lot-history":
      return renderLotHistoryPdf(job.input);
  }
}
