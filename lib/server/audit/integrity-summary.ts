import type { ActionResult } from "@/lib/actions/result";
import { formatDateTime } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";
import type { IntegrityReport } from "./check-integrity";

/** The action result with every finding, one sentence each, for the integrity panel to list. */
export type IntegrityState = (ActionResult & { findings?: string[] }) | null;

/** The integrity report in words: one line for an intact trail, every finding otherwise. */
export function integritySummary(
  report: IntegrityReport,
  ms: number,
): { ok: boolean; message: string; findings: string[] } {
  const newest = report.checkpoints.newest;
  const anchored = newest
    ? `Matches ${report.checkpoints.count} signed checkpoint${report.checkpoints.count === 1 ? "" : "s"} (newest: event ${newest.seq}, ${formatDateTime(newest.at)})${report.checkpoints.uncovered > 0 ? `; the ${report.checkpoints.uncovered} events since are covered by the chain alone until the next checkpoint` : ""}.`
    : "No signed checkpoint exists yet, so a rewrite of the whole file could not be told apart.";
  const key =
    report.checkpoints.key?.source === "generated"
      ? ` The checkpoint key was generated beside the database (${report.checkpoints.key.path}): configure AUDIT_SIGNING_KEY_FILE with a key kept elsewhere.`
      : "";
  if (report.ok) {
    return {
      ok: true,
      message: `Intact: all ${formatNumber(report.chain.events)} events verified in ${ms} ms; each links to the one before. ${anchored} ${report.signatures.checked} signatures match their signing events and their records.${key}`,
      findings: [],
    };
  }
  return {
    ok: false,
    message: `${report.findings.length} integrity problem${report.findings.length === 1 ? "" : "s"} found in ${formatNumber(report.chain.events)} events, ${report.checkpoints.count} checkpoints and ${report.signatures.checked} signatures:`,
    findings: report.findings,
  };
}
