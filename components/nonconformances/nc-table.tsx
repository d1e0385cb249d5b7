import { IntentLink } from "@/components/ui/intent-link";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { formatDate } from "@/lib/format/date";
import { NC_MANUAL_LABELS, NC_SOURCE_LABELS } from "@/lib/nonconformances/lifecycle";
import type { NcListRow } from "@/lib/server/nonconformances/queries";
import { NcStatusWord, SeverityWord } from "./nc-words";

/** Nonconformances as a table: the list page, and the panels on recipe and part-family pages. */
export function NcTable({
  rows,
  caption,
  density = "card",
  empty = "No nonconformances.",
}: {
  rows: NcListRow[];
  caption: string;
  density?: "card" | "compact";
  empty?: string;
}) {
  return (
    <Table caption={caption} density={density}>
      <THead>
        <Th>Number</Th>
        <Th>Title</Th>
        <Th>Source</Th>
        <Th>Severity</Th>
        <Th>Status</Th>
        <Th>Recipe · part family</Th>
        <Th>Detected</Th>
        <Th>Owner</Th>
      </THead>
      <TBody>
        {rows.length === 0 && <EmptyRow colSpan={8}>{empty}</EmptyRow>}
        {rows.map((r) => (
          <tr key={r.id}>
            <Td className="whitespace-nowrap">
              <IntentLink
                href={`/nonconformances/${r.id}`}
                className="font-medium text-brand-800 hover:underline"
              >
                {r.number}
              </IntentLink>
            </Td>
            <Td>{r.title}</Td>
            <Td>
              {r.manualKind ? NC_MANUAL_LABELS[r.manualKind] : NC_SOURCE_LABELS[r.sourceKind]}
              <span className="block text-xs text-stone-600">{r.sourceLabel}</span>
            </Td>
            <Td>
              <SeverityWord severity={r.severity} />
            </Td>
            <Td>
              <NcStatusWord status={r.status} />
            </Td>
            <Td className="whitespace-nowrap">
              {[r.recipeCode, r.familyCode].filter(Boolean).join(" · ") || "—"}
            </Td>
            <Td className="whitespace-nowrap tabular-nums">{formatDate(r.detectedOn)}</Td>
            <Td>{r.owner ?? "not assigned"}</Td>
          </tr>
        ))}
      </TBody>
    </Table>
  );
}
