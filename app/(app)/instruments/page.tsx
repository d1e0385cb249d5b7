import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { PageNav } from "@/components/ui/page-nav";
import { linkButton } from "@/components/parts/link-styles";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { DUE_STATE_LABELS, usesExpiry } from "@/lib/instruments/calibration";
import {
  INSTRUMENT_KIND_LABELS,
  INSTRUMENT_KINDS,
  INSTRUMENT_STATUS_LABELS,
  INSTRUMENT_STATUSES,
  type InstrumentKind,
  type InstrumentStatus,
} from "@/lib/instruments/kinds";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listInstruments } from "@/lib/server/instruments/queries";

export const metadata: Metadata = { title: "Instruments" };

const one = (v: string | string[] | undefined) => (typeof v === "string" ? v.trim() : "");

/** The instrument register, paged, its filters in the address. */
export default async function InstrumentsPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("instrument.view");
  const sp = await searchParams;
  const kind = INSTRUMENT_KINDS.find((k) => k === one(sp.kind));
  const status = INSTRUMENT_STATUSES.find((s) => s === one(sp.status));
  const pageNumber = Math.min(Math.max(1, Number.parseInt(one(sp.page) || "1", 10) || 1), 10_000);
  const { rows, total, pageSize } = await listInstruments({ kind, status, page: pageNumber });
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const href = (p: number) => {
    const q = new URLSearchParams();
    if (kind) q.set("kind", kind);
    if (status) q.set("status", status);
    if (p > 1) q.set("page", String(p));
    const s = q.toString();
    return s ? `/instruments?${s}` : "/instruments";
  };
  return (
    <>
      <PageHeader
        title="Instruments"
        description="The lab's measuring equipment and its calibration: a run cites the instruments it used, and cannot be signed as performed while one is past its due date."
        actions={
          can(user.roles, "instrument.manage") ? (
            <IntentLink href="/instruments/new" className={linkButton}>
              Register an instrument
            </IntentLink>
          ) : undefined
        }
      />
      <ListFilterForm
        label="Filter instruments"
        action="/instruments"
        filters={[
          {
            name: "kind",
            label: "Kind",
            value: kind ?? "",
            options: INSTRUMENT_KINDS.map((k: InstrumentKind) => ({
              value: k,
              label: INSTRUMENT_KIND_LABELS[k],
            })),
          },
          {
            name: "status",
            label: "Status",
            value: status ?? "",
            options: INSTRUMENT_STATUSES.map((s: InstrumentStatus) => ({
              value: s,
              label: INSTRUMENT_STATUS_LABELS[s],
            })),
          },
        ]}
      />
      <Table caption="Instrument register">
        <THead>
          <Th>Asset number</Th>
          <Th>Kind</Th>
          <Th>Description</Th>
          <Th>Location</Th>
          <Th>Status</Th>
          <Th>Calibration</Th>
          <Th>Due or expiry</Th>
        </THead>
        <TBody>
          {rows.length === 0 && <EmptyRow colSpan={7}>No instrument matches.</EmptyRow>}
          {rows.map((r) => (
            <tr key={r.id}>
              <Td className="font-mono text-xs">
                <IntentLink href={`/instruments/${r.id}`} className="text-brand-800 underline">
                  {r.assetNumber}
                </IntentLink>
              </Td>
              <Td>{INSTRUMENT_KIND_LABELS[r.kind]}</Td>
              <Td>{r.description}</Td>
              <Td>{r.location}</Td>
              <Td>{INSTRUMENT_STATUS_LABELS[r.status]}</Td>
              <Td className="font-medium">
                {usesExpiry(r.kind) && r.state === "overdue"
                  ? "Expired"
                  : DUE_STATE_LABELS[r.state]}
              </Td>
              <Td>
                {formatDate(r.dueOn, "—")}
                {usesExpiry(r.kind) && r.dueOn ? " (expiry)" : ""}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      <PageNav
        label="Pages of the register"
        page={pageNumber}
        pages={pages}
        summary={`${total} instrument${total === 1 ? "" : "s"}`}
        href={href}
      />
    </>
  );
}
