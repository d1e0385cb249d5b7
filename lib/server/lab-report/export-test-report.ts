import "server-only";
import { getDb } from "@/db/client";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { renderPdf } from "@/lib/server/pdf/render-pdf";
import { loadTestReport } from "./test-report";

/** Renders a run's test report to PDF and records the export in the audit trail. */
export async function exportTestReport(actor: AuditActor, runId: string, now = new Date()) {
  const report = await loadTestReport(runId);
  if (!report) return null;
  const bytes = await renderPdf({
    kind: "test-report",
    input: { report, printedAt: now.toISOString(), printedBy: actor.name },
  });
  await getDb().transaction((tx) =>
    appendAudit(
      tx,
      actor,
      {
        eventType: "test_run.report_exported",
        recordType: "test_run",
        recordId: runId,
        new: {
          format: "pdf",
          number: report.run.number,
          revision: report.run.revision,
          contentHash: report.run.contentHash,
          bytes: bytes.length,
        },
      },
      now,
    ),
  );
  const filename = `${report.run.number}-rev${report.run.revision}-test-report.pdf`;
  return { bytes, filename };
}
