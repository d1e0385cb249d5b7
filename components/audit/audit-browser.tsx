"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, useReactTable } from "@tanstack/react-table";
import { Download } from "lucide-react";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { useListParams } from "@/components/ui/use-list-params";
import { DataTable } from "@/components/ui/data-table";
import type { AuditPage } from "@/lib/server/audit/query-audit-events";
import { formatDateTime } from "@/lib/format/date";

type Row = AuditPage["items"][number];
type Filters = Record<"actor" | "recordType" | "recordId" | "eventType" | "from" | "to", string>;
const EMPTY: Filters = { actor: "", recordType: "", recordId: "", eventType: "", from: "", to: "" };

function queryString(filters: Filters, before?: number) {
  const params = new URLSearchParams(Object.entries(filters).filter(([, v]) => v !== ""));
  if (before) params.set("before", String(before));
  return params.toString();
}

async function fetchPage(qs: string): Promise<AuditPage> {
  const response = await fetch(`/api/audit-events?${qs}`, { cache: "no-store" });
  const body = await response.json();
  if (!response.ok) {
    const details = body.fieldErrors
      ? Object.values(body.fieldErrors as Record<string, string[]>)
          .flat()
          .join(" ")
      : "";
    throw new Error(`${body.error ?? "The audit trail could not be loaded."} ${details}`.trim());
  }
  return body;
}

const column = createColumnHelper<Row>();
const columns = [
  column.accessor("seq", {
    header: "#",
    cell: (c) => <span className="tabular-nums">{c.getValue()}</span>,
  }),
  column.accessor("at", {
    header: "When (UTC)",
    cell: (c) => (
      <span className="whitespace-nowrap tabular-nums">
        {formatDateTime(c.getValue(), { seconds: true, zone: false })}
      </span>
    ),
  }),
  column.accessor("actorName", { header: "Who" }),
  column.accessor("eventType", {
    header: "Event",
    cell: ({ row }) => (
      <>
        <code className="text-xs">{row.original.eventType}</code>
        {row.original.storedAs !== row.original.eventType && (
          <span className="block text-xs text-stone-500">stored as {row.original.storedAs}</span>
        )}
      </>
    ),
  }),
  column.display({
    id: "record",
    header: "Record",
    cell: ({ row }) => (
      // The id stays in the tooltip for matching against the CSV export; people read the number and name.
      <span className="text-xs" title={row.original.recordId}>
        <span className="block font-medium text-stone-900">
          {row.original.recordLabel ?? row.original.recordId}
        </span>
        <span className="block text-stone-500">{row.original.recordTypeLabel}</span>
      </span>
    ),
  }),
  column.display({
    id: "changes",
    header: "Old → new",
    cell: ({ row }) =>
      row.original.changes.length === 0 ? (
        <span className="text-stone-500">—</span>
      ) : (
        <ul className="space-y-0.5 text-xs">
          {row.original.changes.map((c) => (
            <li key={c.field}>
              <span className="font-medium">{c.label}:</span>{" "}
              {c.words ? (
                c.words.map((w, i) =>
                  w.change === "removed" ? (
                    <del key={i} className="bg-red-50 text-red-800">
                      {w.text}
                    </del>
                  ) : w.change === "added" ? (
                    <ins key={i} className="bg-brand-50 text-brand-800 no-underline">
                      {w.text}
                    </ins>
                  ) : (
                    <span key={i}>{w.text}</span>
                  ),
                )
              ) : (
                <>
                  {c.old !== null && <del className="text-red-800">{c.old}</del>}
                  {c.old !== null && c.new !== null && " → "}
                  {c.new !== null && <ins className="text-brand-800 no-underline">{c.new}</ins>}
                </>
              )}
            </li>
          ))}
        </ul>
      ),
  }),
  column.accessor("reason", { header: "Reason", cell: (c) => c.getValue() ?? "—" }),
];

export interface AuditBrowserProps {
  actors: { id: string; name: string }[];
  eventTypes: string[];
  recordTypes: string[];
  canExport: boolean;
}

export function AuditBrowser({ actors, eventTypes, recordTypes, canExport }: AuditBrowserProps) {
  // The filters live in the address, so a filtered trail can be linked and reloaded; paging stays on this page.
  const [filters, setFilters] = useListParams(EMPTY);
  const [cursors, setCursors] = useState<number[]>([]); // stack of "before" cursors, newest page first
  const before = cursors.at(-1);
  const qs = queryString(filters, before);
  const { data, error, isFetching } = useQuery({
    queryKey: ["audit", qs],
    queryFn: () => fetchPage(qs),
    placeholderData: keepPreviousData,
  });
  // The server pages the trail newest first; the columns do not re-sort a page.
  const table = useReactTable({
    data: data?.items ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    enableSorting: false,
  });

  function apply(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setFilters(
      Object.fromEntries(Object.keys(EMPTY).map((k) => [k, String(form.get(k) ?? "")])) as Filters,
    );
    setCursors([]);
  }

  const select = "block w-full rounded-md border border-stone-300 bg-white px-2 py-1.5 text-sm";
  return (
    <div className="space-y-4">
      <form
        onSubmit={apply}
        aria-label="Filter the audit trail"
        className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-3 xl:grid-cols-7"
      >
        <label className="text-sm">
          User
          <select name="actor" className={select} defaultValue={filters.actor}>
            <option value="">Anyone</option>
            {actors.map((a) => (
              <option key={a.id} value={a.id}>
                {a.name}
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          Record type
          <select name="recordType" className={select} defaultValue={filters.recordType}>
            <option value="">Any</option>
            {recordTypes.map((t) => (
              <option key={t}>{t}</option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          Record id
          <input name="recordId" className={select} defaultValue={filters.recordId} />
        </label>
        <label className="text-sm">
          Event
          <select name="eventType" className={select} defaultValue={filters.eventType}>
            <option value="">Any</option>
            {eventTypes.map((a) => (
              <option key={a}>{a}</option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          From
          <input type="date" name="from" className={select} defaultValue={filters.from} />
        </label>
        <label className="text-sm">
          To
          <input type="date" name="to" className={select} defaultValue={filters.to} />
        </label>
        <div className="flex items-end gap-2">
          <Button type="submit">Filter</Button>
          {canExport && (
            <a
              href={`/api/audit-events/export?${queryString(filters)}`}
              className="inline-flex items-center gap-1 rounded-md border border-stone-300 bg-white px-3 py-2 text-sm hover:bg-stone-100"
              download
            >
              <Download className="h-4 w-4" aria-hidden="true" /> CSV
            </a>
          )}
        </div>
      </form>

      {error && (
        <p
          role="alert"
          className="rounded-md border border-red-300 bg-red-50 px-3 py-2 text-sm text-red-900"
        >
          {error.message}
        </p>
      )}

      <DataTable
        table={table}
        caption="Audit events, newest first"
        busy={isFetching}
        bodyClassName="align-top"
        empty={data ? "No events match these filters." : undefined}
      />

      <div className="flex items-center justify-between text-sm">
        <Button
          variant="secondary"
          disabled={cursors.length === 0}
          onClick={() => setCursors((c) => c.slice(0, -1))}
        >
          ← Newer
        </Button>
        <span className="text-stone-600">
          {isFetching ? "Loading…" : `Page ${cursors.length + 1}`}
        </span>
        <Button
          variant="secondary"
          disabled={!data?.nextBefore}
          onClick={() => data?.nextBefore && setCursors((c) => [...c, data.nextBefore!])}
        >
          Older →
        </Button>
      </div>
    </div>
  );
}
