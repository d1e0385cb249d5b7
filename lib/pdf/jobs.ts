import { renderAuditPackPdf, type AuditPackPdfInput } from "./audit-pack-pdf";
import { renderDocumentPdf, type DocumentPdfInput } from "./document-pdf";
import { renderLotHistoryPdf, type LotHistoryPdfInput } from "./lot-history-pdf";
import { renderTestReportPdf, type TestReportPdfInput } from "./test-report-pdf";

/** What the PDF worker process is asked to render; plain data, so it crosses the process boundary. */
export type PdfJob =
  | { kind: "document"; input: DocumentPdfInput }
  | { kind: "audit-pack"; input: AuditPackPdfInput }
  | { kind: "lot-history"; input: LotHistoryPdfInput }
  | { kind: "test-report"; input: TestReportPdfInput };

export function renderJob(job: PdfJob): Promise<Buffer> {
  switch (job.kind) {
    case "document":
      return renderDocumentPdf(job.input);
    case "audit-pack":
      return renderAuditPackPdf(job.input);
    case "lot-history":
      return renderLotHistoryPdf(job.input);
    case "test-report":
      return renderTestReportPdf(job.input);
  }
}
