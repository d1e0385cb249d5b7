"use client";

import { useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useRef, useState, type InputHTMLAttributes } from "react";
import {
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type PaginationState,
  type SortingState,
} from "@tanstack/react-table";
import { IntentLink } from "@/components/ui/intent-link";
import { useListParams } from "@/components/ui/use-list-params";
import { OUTCOMES, TEST_TYPES } from "@/db/enums";
import { RequestRefused } from "@/lib/http/refused";
import { humanize } from "@/lib/format/labels";
import {
  EVIDENCE_LIST_DEFAULTS,
  usableListAddress,
  type EvidenceListAddress,
} from "@/lib/evidence/list-address";
import type { EvidenceListPage, EvidenceListRow } from "@/lib/schemas/evidence-list";
import { Button } from "@/components/ui/button";
import { DataTable } from "@/components/ui/data-table";
import { OutcomeWord, RunStatusWord } from "./status-word";

const columns: ColumnDef<EvidenceListRow>[] = [
  {
    id: "number",
    header: "Run",
    accessorKey: "number",
    cell: ({ row }) => (
      <IntentLink
        href={`/evidence/runs/${row.original.id}`}
        className="font-medium text-brand-800 hover:underline"
      >
        {row.original.number}
        {row.original.revision > 1 ? ` rev ${row.original.revision}` : ""}
      </IntentLink>
    ),
  },
  {
    id: "performedOn",
    header: "Date",
    accessorKey: "performedOn",
    cell: ({ row }) => row.original.performedOn ?? "—",
  },
  { id: "partFamily", header: "Part family", accessorKey: "partFamily" },
  { id: "recipe", header: "Recipe version", accessorKey: "recipe", enableSorting: false },
  {
    id: "testType",
    header: "Test",
    accessorKey: "testType",
    cell: ({ row }) => humanize(row.original.testType),
  },
  {
    id: "outcome",
    header: "Outcome",
    accessorKey: "outcome",
    cell: ({ row }) => <OutcomeWord outcome={row.original.outcome} />,
  },
  {
    id: "status",
    header: "Status",
    accessorKey: "status",
    cell: ({ row }) => <RunStatusWord status={row.original.status as "open"} />,
  },
  {
    id: "technician",
    header: "Technician",
    accessorKey: "technician",
    enableSorting: false,
    cell: ({ row }) => row.original.technician ?? "—",
  },
];

export interface EvidenceTableProps {
  families: { id: string; code: string }[];
  recipes: { id: string; code: string }[];
}

type Filters = Omit<EvidenceListAddress, "sort" | "dir" | "page">;
const PAGE_SIZE = 20;

async function fetchPage(params: URLSearchParams): Promise<EvidenceListPage> {
  const response = await fetch(`/api/evidence/runs?${params}`, { cache: "no-store" });
  const body = await response.json().catch(() => null);
  if (!response.ok) {
    const message = body?.error ?? "The list could not be loaded.";
    throw response.status < 500 ? new RequestRefused(message) : new Error(message);
  }
  return body;
}

/**
 * A box whose text is kept in the address: what is typed shows at once, and the address follows.
 * Bound to the address alone, a fast second keystroke landed before the address had caught up
 * with the first and replaced it ("12" became "2"). The address's value is shown again when it
 * changes to one this box did not send (Back, a cleared filter).
 */
function TypedInput({
  param,
  value,
  onType,
  ...input
}: Omit<InputHTMLAttributes<HTMLInputElement>, "value" | "onChange"> & {
  /** Its name in the address. */
  param: string;
  value: string;
  onType: (value: string) => void;
}) {
  const [text, setText] = useState(value);
  // What was typed since the box took focus: the address passes through each on its way.
  const sent = useRef(new Set<string>());
  useEffect(() => {
    if (!sent.current.has(value)) setText(value);
  }, [value]);
  // Back and Forward show the address's value at once: under load the list's own reading of the
  // address can still be on its way, and would not change from what it was.
  useEffect(() => {
    const onHistory = () => setText(new URLSearchParams(window.location.search).get(param) ?? "");
    window.addEventListener("popstate", onHistory);
    return () => window.removeEventListener("popstate", onHistory);
  }, [param]);
  return (
    <input
      {...input}
      value={input.disabled ? value : text}
      onChange={(event) => {
        sent.current.add(event.target.value);
        setText(event.target.value);
        onType(event.target.value);
      }}
      onFocus={() => sent.current.clear()}
    />
  );
}

/** The evidence list: filters, sorting and paging are done by the server; the page is fetched here. */
export function EvidenceTable({ families, recipes }: EvidenceTableProps) {
  const [address, setList] = useListParams(EVIDENCE_LIST_DEFAULTS);
  const known = useMemo(
    () => ({
      familyIds: new Set(families.map((f) => f.id)),
      recipeIds: new Set(recipes.map((r) => r.id)),
    }),
    [families, recipes],
  );
  // An old or edited address opens the list with what it can use; the address is corrected too.
  const list = usableListAddress(address, EVIDENCE_LIST_DEFAULTS, known);
  const unusable = JSON.stringify(list) !== JSON.stringify(address);
  useEffect(() => {
    if (unusable) setList(list, "correction");
  }, [unusable, list, setList]);
  const { sort, dir, page, ...filters } = list;
  const sorting: SortingState = [{ id: sort, desc: dir !== "asc" }];
  const pageIndex = Math.max(0, (Number.parseInt(page, 10) || 1) - 1);
  const pagination: PaginationState = { pageIndex, pageSize: PAGE_SIZE };
  const setSorting = (updater: SortingState | ((old: SortingState) => SortingState)) => {
    const next = typeof updater === "function" ? updater(sorting) : updater;
    setList({
      sort: next[0]?.id ?? EVIDENCE_LIST_DEFAULTS.sort,
      dir: next[0]?.desc === false ? "asc" : "desc",
      page: "1",
    });
  };
  const setPagination = (
    updater: PaginationState | ((old: PaginationState) => PaginationState),
  ) => {
    const next = typeof updater === "function" ? updater(pagination) : updater;
    setList({ page: String(next.pageIndex + 1) });
  };
  // A version number counts only under a chosen recipe, and only as a whole number from 1.
  const versionProblem =
    filters.recipeId && filters.version !== "" && !/^[1-9]\d{0,5}$/.test(filters.version)
      ? "Enter a whole version number from 1."
      : null;
  const sent = {
    ...filters,
    version: filters.recipeId && !versionProblem ? filters.version : "",
  };
  const params = new URLSearchParams({
    ...Object.fromEntries(Object.entries(sent).filter(([, v]) => v !== "")),
    sort: sorting[0]?.id ?? "performedOn",
    dir: sorting[0]?.desc === false ? "asc" : "desc",
    page: String(pagination.pageIndex + 1),
    pageSize: String(pagination.pageSize),
  });
  const { data, error, isFetching } = useQuery({
    queryKey: ["evidence", params.toString()],
    queryFn: () => fetchPage(params),
    placeholderData: (prev) => prev,
  });
  const table = useReactTable({
    columns,
    getCoreRowModel: getCoreRowModel(),
    data: data?.rows ?? [],
    state: { sorting, pagination },
    onSortingChange: setSorting,
    onPaginationChange: setPagination,
    manualSorting: true,
    // A click on the sorted column turns its order round; there is always one order.
    enableSortingRemoval: false,
    manualPagination: true,
    enableMultiSort: false,
    rowCount: data?.total ?? 0,
  });
  const setFilter = (key: keyof Filters) => (event: { target: { value: string } }) => {
    setList({ [key]: event.target.value, page: "1" });
  };
  const pages = Math.max(1, Math.ceil((data?.total ?? 0) / pagination.pageSize));
  // A page past the end (an old link, an edited address) shows the last page, as the server lists do.
  const pastTheEnd = data !== undefined && data.total > 0 && pagination.pageIndex + 1 > pages;
  useEffect(() => {
    // A correction, not a step of the user's: Back should not return to the empty page.
    if (pastTheEnd) setList({ page: String(pages) }, "correction");
  }, [pastTheEnd, pages, setList]);
  const select =
    "block w-full rounded-md border border-stone-300 bg-white px-2 py-1.5 text-sm disabled:cursor-not-allowed disabled:bg-stone-100 disabled:text-stone-500";
  return (
    <section aria-label="Test runs">
      <form
        className="mb-3 grid gap-3 rounded-lg border border-stone-200 bg-white p-3 sm:grid-cols-4 lg:grid-cols-7"
        aria-label="Filter test runs"
        onSubmit={(e) => e.preventDefault()}
      >
        <label className="text-xs text-stone-600">
          Part family
          <select
            className={select}
            value={filters.partFamilyId}
            onChange={setFilter("partFamilyId")}
          >
            <option value="">All</option>
            {families.map((f) => (
              <option key={f.id} value={f.id}>
                {f.code}
              </option>
            ))}
          </select>
        </label>
        <label className="text-xs text-stone-600">
          Recipe
          <select
            className={select}
            value={filters.recipeId}
            onChange={(e) => setList({ recipeId: e.target.value, version: "", page: "1" })}
          >
            <option value="">All</option>
            {recipes.map((r) => (
              <option key={r.id} value={r.id}>
                {r.code}
              </option>
            ))}
          </select>
        </label>
        <label className="text-xs text-stone-600">
          Version
          <TypedInput
            param="version"
            type="number"
            min={1}
            step={1}
            inputMode="numeric"
            placeholder={filters.recipeId ? "All" : "—"}
            title={filters.recipeId ? undefined : "Choose a recipe first"}
            disabled={!filters.recipeId}
            aria-invalid={versionProblem !== null}
            aria-describedby={versionProblem ? "version-problem" : undefined}
            className={select}
            value={filters.recipeId ? filters.version : ""}
            onType={(v) => setList({ version: v, page: "1" }, "typing")}
          />
          {versionProblem && (
            <span id="version-problem" className="mt-1 block text-red-800">
              {versionProblem}
            </span>
          )}
        </label>
        <label className="text-xs text-stone-600">
          Test type
          <select className={select} value={filters.testType} onChange={setFilter("testType")}>
            <option value="">All</option>
            {TEST_TYPES.map((t) => (
              <option key={t} value={t}>
                {humanize(t)}
              </option>
            ))}
          </select>
        </label>
        <label className="text-xs text-stone-600">
          Outcome
          <select className={select} value={filters.outcome} onChange={setFilter("outcome")}>
            <option value="">All</option>
            {OUTCOMES.map((o) => (
              <option key={o} value={o}>
                {humanize(o)}
              </option>
            ))}
          </select>
        </label>
        <label className="text-xs text-stone-600">
          From
          <TypedInput
            param="from"
            type="date"
            className={select}
            value={filters.from}
            onType={(v) => setList({ from: v, page: "1" }, "typing")}
          />
        </label>
        <label className="text-xs text-stone-600">
          To
          <TypedInput
            param="to"
            type="date"
            className={select}
            value={filters.to}
            onType={(v) => setList({ to: v, page: "1" }, "typing")}
          />
        </label>
      </form>
      {error && (
        <p role="alert" className="mb-3 text-sm text-red-800">
          {error.message}
        </p>
      )}
      <DataTable
        table={table}
        caption={`Test runs, ${(data?.total ?? 0).toLocaleString("en")} found`}
        busy={isFetching}
        bodyClassName="whitespace-nowrap"
        empty={
          data
            ? "No test runs match these filters."
            : error
              ? "The list could not be loaded."
              : undefined
        }
      />
      <div className="mt-3 flex items-center justify-between text-sm text-stone-700">
        <p>
          {data
            ? `${data.total.toLocaleString("en")} run${data.total === 1 ? "" : "s"} · page ${(pagination.pageIndex + 1).toLocaleString("en")} of ${pages.toLocaleString("en")}`
            : error
              ? ""
              : "Loading…"}
        </p>
        <div className="flex gap-2">
          <Button
            variant="secondary"
            onClick={() => table.previousPage()}
            disabled={!table.getCanPreviousPage()}
          >
            Previous page
          </Button>
          <Button
            variant="secondary"
            onClick={() => table.nextPage()}
            disabled={!table.getCanNextPage()}
          >
            Next page
          </Button>
        </div>
      </div>
    </section>
  );
}
