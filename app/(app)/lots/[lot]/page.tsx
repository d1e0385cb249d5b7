import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { bathLine } from "@/lib/cycles/lot-export";
import { formatDateTime } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";
import { NC_SEVERITY_LABELS, NC_STATUS_LABELS } from "@/lib/nonconformances/lifecycle";
import { TEST_TYPE_LABELS, type TestType } from "@/lib/recipes/test-types";
import { lotFromPath } from "@/lib/schemas/cycle";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { lotHistory } from "@/lib/server/cycles/queries";

export const metadata: Metadata = { title: "Lot history" };

const secondary =
  "rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-50";

export default async function LotHistoryPage({ params }: { params: Promise<{ lot: string }> }) {
  await requirePageUser("evidence.view");
  const parsed = lotFromPath((await params).lot);
  if (!parsed.success) notFound();
  const h = await lotHistory(parsed.data);
  if (h.cycles.length === 0) notFound();
  const flagged = h.cycles.filter((c) => c.flagged).length;
  const exportHref = (format: string) =>
    `/api/lots/${encodeURIComponent(h.lot)}/export?format=${format}`;
  return (
    <>
      <PageHeader
        title={`Lot ${h.lot}`}
        description={`${h.cycles.length} cycle(s), ${flagged === 0 ? "none flagged" : `${flagged} flagged`}; ${h.runs.length} test run(s) on parts from these cycles; ${h.nonconformances.length} nonconformance(s).`}
        actions={
          <>
            <a href={exportHref("csv")} className={secondary}>
              Export CSV
            </a>
            <a href={exportHref("pdf")} className={secondary}>
              Export PDF
            </a>
          </>
        }
      />
      <Table caption="Cycles that washed the lot">
        <THead>
          <Th>Cycle</Th>
          <Th>Ran</Th>
          <Th>Recipe version</Th>
          <Th>Values</Th>
          <Th>Bath at the start</Th>
          <Th>Flag</Th>
        </THead>
        <TBody className="align-top">
          {h.cycles.map((c) => (
            <tr key={c.id}>
              <Td>
                <span className="font-medium">{c.cycleNumber}</span>
                <span className="block text-xs text-stone-600">
                  {c.system} · {c.partFamily} · {c.baskets} basket(s)
                </span>
                {c.lots.length > 1 && (
                  <span className="block text-xs text-stone-600">
                    With {c.lots.filter((l) => l !== h.lot).join(", ")}
                  </span>
                )}
              </Td>
              <Td>
                {formatDateTime(c.startedAt)}
                <span className="block text-xs text-stone-600">
                  to {formatDateTime(c.endedAt)} · {c.operator}
                </span>
              </Td>
              <Td>
                {c.recipe} v{c.version}
              </Td>
              <Td className="text-xs">
                {Object.entries(c.actualValues).map(([k, v]) => (
                  <span key={k} className="block tabular-nums">
                    {k} {formatNumber(v)}
                  </span>
                ))}
              </Td>
              <Td className="text-xs">
                {c.bath.length === 0
                  ? "No tank on this washer."
                  : c.bath.map((b) => (
                      <span key={b.stageName} className="block">
                        {bathLine(b)}
                      </span>
                    ))}
              </Td>
              <Td>
                {c.flagged ? (
                  <>
                    <strong>Flagged</strong>
                    <span className="block text-xs">{c.flagReasons.join(" ")}</span>
                  </>
                ) : (
                  "In range"
                )}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      <div className="mt-6">
        <Table caption="Test runs on parts from these cycles" captionVisible>
          <THead>
            <Th>Run</Th>
            <Th>Test</Th>
            <Th>Performed</Th>
            <Th>Status and outcome</Th>
            <Th>Parts from</Th>
          </THead>
          <TBody>
            {h.runs.length === 0 && (
              <EmptyRow colSpan={5}>No test run names a cycle of this lot.</EmptyRow>
            )}
            {h.runs.map((r) => (
              <tr key={r.id}>
                <Td>
                  <IntentLink
                    href={`/evidence/runs/${r.id}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    {r.number}
                    {r.revision > 1 ? ` rev ${r.revision}` : ""}
                  </IntentLink>
                </Td>
                <Td>{TEST_TYPE_LABELS[r.testType as TestType] ?? r.testType}</Td>
                <Td>{r.performedOn ?? "—"}</Td>
                <Td>
                  {r.status} · {r.outcome ?? "not computed"}
                </Td>
                <Td>
                  {r.cycles
                    .map((c) => `${c.cycleNumber} (${c.samples} part${c.samples === 1 ? "" : "s"})`)
                    .join(", ")}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      </div>
      <div className="mt-6">
        <Table caption="Nonconformances naming this lot" captionVisible>
          <THead>
            <Th>Nonconformance</Th>
            <Th>Detected</Th>
            <Th>Severity and status</Th>
            <Th>Names</Th>
          </THead>
          <TBody>
            {h.nonconformances.length === 0 && (
              <EmptyRow colSpan={4}>No nonconformance names this lot or its cycles.</EmptyRow>
            )}
            {h.nonconformances.map((nc) => (
              <tr key={nc.id}>
                <Td>
                  <IntentLink
                    href={`/nonconformances/${nc.id}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    {nc.number}
                  </IntentLink>
                  <span className="block text-xs text-stone-600">{nc.title}</span>
                </Td>
                <Td>{nc.detectedOn}</Td>
                <Td>
                  {NC_SEVERITY_LABELS[nc.severity]} · {NC_STATUS_LABELS[nc.status]}
                </Td>
                <Td className="text-xs">
                  {nc.names.join(", ") || "Raised from a cycle or run of this lot"}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      </div>
    </>
  );
}
