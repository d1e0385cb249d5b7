"use client";

import { flexRender, type Table as TanStackTable } from "@tanstack/react-table";
import { ArrowDown, ArrowUp, ArrowUpDown } from "lucide-react";
import type { ReactNode } from "react";
import { EmptyRow, TBody, Table, Td, Th, THead, type TableDensity } from "./table";

declare module "@tanstack/react-table" {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars -- TData and TValue are part of the interface being extended
  interface ColumnMeta<TData, TValue> {
    /** Right-align the column (measured values). */
    align?: "left" | "right" | "center";
    /** Extra classes for the column's body cells. */
    cellClassName?: string;
  }
}

export interface DataTableProps<T> {
  /** The TanStack table; the caller owns its state (sorting, paging, filters), often in the URL or on the server. */
  table: TanStackTable<T>;
  caption: ReactNode;
  /** Shown in one row when the table has no rows; leave undefined while the first page loads. */
  empty?: ReactNode;
  busy?: boolean;
  density?: TableDensity;
  bodyClassName?: string;
}

/**
 * A list that sorts, filters or pages: TanStack Table's state on the one table look. A sortable
 * column's heading is a button and the heading carries `aria-sort`, so the order is announced.
 */
export function DataTable<T>({
  table,
  caption,
  empty,
  busy,
  density = "card",
  bodyClassName,
}: DataTableProps<T>) {
  const rows = table.getRowModel().rows;
  const columnCount = table.getVisibleLeafColumns().length;
  return (
    <Table caption={caption} density={density} busy={busy}>
      {table.getHeaderGroups().map((group) => (
        <THead key={group.id}>
          {group.headers.map((header) => {
            const sorted = header.column.getIsSorted();
            const label = header.isPlaceholder
              ? null
              : flexRender(header.column.columnDef.header, header.getContext());
            return (
              <Th
                key={header.id}
                align={header.column.columnDef.meta?.align}
                aria-sort={
                  sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined
                }
              >
                {header.column.getCanSort() ? (
                  <button
                    type="button"
                    className="inline-flex items-center gap-1 uppercase hover:text-stone-900"
                    onClick={header.column.getToggleSortingHandler()}
                  >
                    {label}
                    {sorted === "asc" ? (
                      <ArrowUp className="h-3 w-3" aria-hidden="true" />
                    ) : sorted === "desc" ? (
                      <ArrowDown className="h-3 w-3" aria-hidden="true" />
                    ) : (
                      <ArrowUpDown className="h-3 w-3" aria-hidden="true" />
                    )}
                  </button>
                ) : (
                  label
                )}
              </Th>
            );
          })}
        </THead>
      ))}
      <TBody className={bodyClassName}>
        {rows.map((row) => (
          <tr key={row.id}>
            {row.getVisibleCells().map((cell) => (
              <Td
                key={cell.id}
                align={cell.column.columnDef.meta?.align}
                className={cell.column.columnDef.meta?.cellClassName}
              >
                {flexRender(cell.column.columnDef.cell, cell.getContext())}
              </Td>
            ))}
          </tr>
        ))}
        {rows.length === 0 && empty !== undefined && (
          <EmptyRow colSpan={columnCount}>{empty}</EmptyRow>
        )}
      </TBody>
    </Table>
  );
}
