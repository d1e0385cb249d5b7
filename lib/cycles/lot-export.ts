import { toCsv } from "@/lib/csv/to-csv";
import { formatDateTime } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";
import { NC_SEVERITY_LABELS, NC_STATUS_LABELS } from "@/lib/nonconformances/lifecycle";
import type { LotHistory } from "@/lib/server/cycles/lot-history";

/** A tank's bath as it stood at the cycle's start, in one line. */
export function bathLine(b: LotHistory["cycles"][number]["bath"][number]): string {
  const r = b.reading;
  const parts = r
    ? [
        r.concentrationPct !== null ? `${formatNumber(r.concentrationPct)} %` : null,
        r.conductivityUsPerCm !== null ? `${formatNumber(r.conductivityUsPerCm)} µS/cm` : null,
        r.temperatureC !== null ? `${formatNumber(r.temperatureC)} °C` : null,
      ].filter(Boolean)
    : [];
  const reading = r
    ? `read ${formatDateTime(r.performedAt)}: ${parts.join(", ") || "no values"}`
    : "no reading before";
  const change = b.lastBathChangeAt ? `; bath changed ${formatDateTime(b.lastBathChangeAt)}` : "";
  return `${b.stageName} — ${reading}${change}`;
}

/** One row per cycle, then one per test run and per nonconformance, as the lot history page shows them. */
export function lotHistoryCsv(h: LotHistory): string {
  const header = [
    "record",
    "lot",
    "cycle",
    "washer",
    "recipe",
    "version",
    "part_family",
    "lots",
    "baskets",
    "started_at",
    "ended_at",
    "operator",
    "values",
    "flag",
    "bath_at_start",
    "test_run",
    "test_type",
    "status",
    "outcome",
    "nonconformance",
    "severity",
    "names",
  ];
  const rows: (string | number | null)[][] = [
    ...h.cycles.map((c) => [
      "cycle",
      h.lot,
      c.cycleNumber,
      c.system,
      c.recipe,
      c.version,
      c.partFamily,
      c.lots.join(" "),
      c.baskets,
      c.startedAt,
      c.endedAt,
      c.operator,
      Object.entries(c.actualValues)
        .map(([k, v]) => `${k}=${v}`)
        .join("; "),
      c.flagged ? `flagged: ${c.flagReasons.join(" ")}` : "in range",
      c.bath.map(bathLine).join(" | "),
      null,
      null,
      null,
      null,
      null,
      null,
      null,
    ]),
    ...h.runs.map((r) => [
      "test_run",
      h.lot,
      r.cycles.map((c) => `${c.cycleNumber} (${c.samples})`).join(" "),
      null,
      null,
      null,
      null,
      null,
      null,
      r.performedOn,
      null,
      null,
      null,
      null,
      null,
      r.revision > 1 ? `${r.number} rev ${r.revision}` : r.number,
      r.testType,
      r.status,
      r.outcome,
      null,
      null,
      null,
    ]),
    ...h.nonconformances.map((nc) => [
      "nonconformance",
      h.lot,
      null,
      null,
      null,
      null,
      null,
      null,
      null,
      nc.detectedOn,
      null,
      null,
      null,
      null,
      null,
      null,
      null,
      NC_STATUS_LABELS[nc.status],
      null,
      `${nc.number} ${nc.title}`,
      NC_SEVERITY_LABELS[nc.severity],
      nc.names.join(" | "),
    ]),
  ];
  return toCsv(header, rows);
}
