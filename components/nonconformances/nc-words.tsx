import type { NC_SEVERITIES } from "@/db/enums";
import {
  NC_SEVERITY_LABELS,
  NC_STATUS_LABELS,
  type NcStatus,
} from "@/lib/nonconformances/lifecycle";

/** Status as a word; closed and cancelled read quieter than work in progress. */
export function NcStatusWord({ status }: { status: NcStatus }) {
  const finished = status === "closed" || status === "cancelled";
  return (
    <span
      className={`inline-block rounded px-1.5 py-0.5 text-xs font-medium ${finished ? "bg-stone-100 text-stone-700" : "bg-brand-50 text-brand-900"}`}
    >
      {NC_STATUS_LABELS[status]}
    </span>
  );
}

export function SeverityWord({ severity }: { severity: (typeof NC_SEVERITIES)[number] }) {
  return (
    <span className={severity === "critical" ? "font-semibold text-red-800" : undefined}>
      {NC_SEVERITY_LABELS[severity]}
    </span>
  );
}
