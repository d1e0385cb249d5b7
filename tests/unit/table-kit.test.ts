import { getCoreRowModel, useReactTable, type ColumnDef } from "@tanstack/react-table";
import { createElement as h } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { DataTable } from "@/components/ui/data-table";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";

// The browser tests find tables by role and name (getByRole("table", { name })), rows by their
// cells' text, and headings as column headers: the kit must render exactly that semantic HTML.

describe("Table", () => {
  const html = renderToStaticMarkup(
    h(
      Table,
      { caption: "Bath log" },
      h(THead, null, h(Th, null, "When (UTC)"), h(Th, { align: "right" }, "Concentration")),
      h(
        TBody,
        null,
        h("tr", null, h(Td, null, "2026-06-15 07:00"), h(Td, { numeric: true }, "3.05 %")),
      ),
    ),
  );

  it("is a semantic table named by its caption, with column headers scoped to their columns", () => {
    expect(html).toMatch(
      /^<div class="overflow-x-auto[^"]*"><table[^>]*><caption class="sr-only">Bath log<\/caption><thead><tr><th scope="col"/,
    );
    expect(html.match(/<th scope="col"/g)).toHaveLength(2);
    expect(html).toContain("<tbody");
    expect(html.match(/<td /g)).toHaveLength(2);
  });

  it("right-aligns measured values with figures of equal width", () => {
    expect(html).toMatch(/<td class="[^"]*text-right[^"]*tabular-nums[^"]*">3.05 %<\/td>/);
    expect(html).toMatch(/<th scope="col" class="[^"]*text-right[^"]*">Concentration<\/th>/);
  });

  it("scrolls sideways inside its frame and holds the first column, unless told not to", () => {
    expect(html).toContain("[&amp;_tr&gt;:first-child]:sticky");
    const loose = renderToStaticMarkup(
      h(Table, { caption: "x", stickyFirstColumn: false }, h(TBody, null)),
    );
    expect(loose).not.toContain(":sticky");
    expect(loose).toContain("overflow-x-auto");
  });

  it("shows a visible caption only when asked, and a row label as a row header", () => {
    const visible = renderToStaticMarkup(
      h(
        Table,
        { caption: "Samples", captionVisible: true },
        h(TBody, null, h("tr", null, h(Th, { scope: "row" }, "Cpk"), h(Td, null, "1.4"))),
      ),
    );
    expect(visible).toMatch(/<caption class="(?![^"]*sr-only)[^"]*">Samples<\/caption>/);
    expect(visible).toMatch(/<th scope="row"[^>]*>Cpk<\/th>/);
  });

  it("spans the empty message across every column", () => {
    const empty = renderToStaticMarkup(
      h(
        Table,
        { caption: "x" },
        h(TBody, null, h(EmptyRow, { colSpan: 4, children: "Nothing matches." })),
      ),
    );
    expect(empty).toMatch(/<td colSpan="4"[^>]*>Nothing matches.<\/td>/i);
  });
});

type Row = { id: string; number: string; value: number };
const columns: ColumnDef<Row>[] = [
  { id: "number", header: "Run", accessorKey: "number" },
  {
    id: "value",
    header: "Value",
    accessorKey: "value",
    enableSorting: false,
    meta: { align: "right" },
  },
];

function render(data: Row[], options: { sorted?: boolean; empty?: string } = {}) {
  function Harness() {
    const table = useReactTable({
      data,
      columns,
      getCoreRowModel: getCoreRowModel(),
      manualSorting: true,
      state: { sorting: options.sorted ? [{ id: "number", desc: true }] : [] },
    });
    return h(DataTable<Row>, { table, caption: "Test runs", empty: options.empty });
  }
  return renderToStaticMarkup(h(Harness));
}

describe("DataTable", () => {
  it("makes a sortable heading a button and announces the current order", () => {
    const html = render([{ id: "a", number: "TR-1", value: 2 }], { sorted: true });
    expect(html).toMatch(
      /<th scope="col" class="[^"]*" aria-sort="descending"><button type="button"[^>]*>Run/,
    );
    // The column the server does not sort is plain text with no aria-sort.
    expect(html).toMatch(/<th scope="col" class="[^"]*text-right[^"]*">Value<\/th>/);
    expect(html).toMatch(/<td class="[^"]*text-right[^"]*">2<\/td>/);
  });

  it("leaves aria-sort off an unsorted sortable column", () => {
    const html = render([{ id: "a", number: "TR-1", value: 2 }]);
    expect(html).toMatch(/<th scope="col" class="[^"]*"><button type="button"[^>]*>Run/);
    expect(html).not.toContain("aria-sort");
  });

  it("shows the empty message in one row spanning the columns, and nothing while it has none to show", () => {
    expect(render([], { empty: "No test runs match these filters." })).toMatch(
      /<td colSpan="2"[^>]*>No test runs match these filters.<\/td>/i,
    );
    expect(render([])).not.toContain("<td");
  });
});
