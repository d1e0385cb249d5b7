import type { ReactNode, TableHTMLAttributes, TdHTMLAttributes, ThHTMLAttributes } from "react";

/**
 * The one table look (a lab record: small uppercase headings, hairline rows, numbers right-aligned).
 * Plain semantic HTML with no hooks, so server and client components both use it; a list that sorts,
 * filters or pages wraps it in `DataTable` (components/ui/data-table.tsx).
 *
 * - `card`: a list that is the page's subject, in its own bordered white frame with a tinted header.
 * - `compact`: a table inside a card or a panel, aligned with the text around it (no left padding).
 *
 * Cells take their padding from CSS variables set by the table, so a cell may change its own
 * (`[--cell-py:1.5rem]`) without fighting the table's classes.
 */
export type TableDensity = "card" | "compact";

const FRAME: Record<TableDensity, string> = {
  card: "overflow-x-auto rounded-lg border border-stone-200 bg-white",
  compact: "overflow-x-auto",
};

const DENSITY: Record<TableDensity, string> = {
  card: "[--cell-pl:0.75rem] [--cell-pr:0.75rem] [--cell-py:0.5rem] [&_thead]:bg-stone-50 [&_thead]:[--sticky-bg:var(--color-stone-50)]",
  compact:
    "[--cell-pl:0rem] [--cell-pr:0.75rem] [--cell-py:0.375rem] [&_thead]:border-b [&_thead]:border-stone-200",
};

// On a narrow screen (a tablet at 820 px) a wide table scrolls inside its frame; the first column,
// which names the row, stays in place so a reader never loses which row a value belongs to.
const STICKY_FIRST =
  "[--sticky-bg:var(--color-white)] [&_tr>:first-child]:sticky [&_tr>:first-child]:left-0 [&_tr>:first-child]:z-[1] [&_tr>:first-child]:bg-(--sticky-bg) [&_tr>:first-child]:shadow-[inset_-1px_0_0_var(--color-stone-100)]";

export interface TableProps extends TableHTMLAttributes<HTMLTableElement> {
  /** Names the table for assistive technology and for tests (`getByRole("table", { name })`). */
  caption?: ReactNode;
  /** Show the caption as a small heading above the table instead of keeping it for screen readers. */
  captionVisible?: boolean;
  density?: TableDensity;
  /** Keep the first column in place when the table scrolls sideways (on by default). */
  stickyFirstColumn?: boolean;
  /** Marks the frame busy while a new page is loading. */
  busy?: boolean;
  frameClassName?: string;
}

export function Table({
  caption,
  captionVisible = false,
  density = "card",
  stickyFirstColumn = true,
  busy,
  frameClassName = "",
  className = "",
  children,
  ...props
}: TableProps) {
  return (
    <div className={`${FRAME[density]} ${frameClassName}`} aria-busy={busy}>
      <table
        className={`w-full text-sm ${DENSITY[density]} ${stickyFirstColumn ? STICKY_FIRST : ""} ${className}`}
        {...props}
      >
        {caption !== undefined && (
          <caption className={captionVisible ? "mb-1 text-left text-sm font-semibold" : "sr-only"}>
            {caption}
          </caption>
        )}
        {children}
      </table>
    </div>
  );
}

/** The header row: pass the `Th` cells as children. */
export function THead({ children }: { children: ReactNode }) {
  return (
    <thead>
      <tr>{children}</tr>
    </thead>
  );
}

type Align = "left" | "right" | "center";
const ALIGN: Record<Align, string> = {
  left: "text-left",
  right: "text-right",
  center: "text-center",
};
const PAD = "pl-(--cell-pl) pr-(--cell-pr) py-(--cell-py)";

export interface ThProps extends ThHTMLAttributes<HTMLTableCellElement> {
  align?: Align;
}

/** A column heading (`scope="col"`), or with `scope="row"` the label that starts a row. */
export function Th({ align = "left", scope = "col", className = "", ...props }: ThProps) {
  const look =
    scope === "row" ? "font-normal text-stone-700" : "text-xs font-medium text-stone-500 uppercase";
  return <th scope={scope} className={`${PAD} ${ALIGN[align]} ${look} ${className}`} {...props} />;
}

export interface TBodyProps {
  children: ReactNode;
  className?: string;
}

export function TBody({ children, className = "" }: TBodyProps) {
  return <tbody className={`divide-y divide-stone-100 ${className}`}>{children}</tbody>;
}

export interface TdProps extends TdHTMLAttributes<HTMLTableCellElement> {
  align?: Align;
  /** Right-aligned with figures of equal width, for a column of measured values. */
  numeric?: boolean;
}

export function Td({ align, numeric = false, className = "", ...props }: TdProps) {
  const alignment = ALIGN[align ?? (numeric ? "right" : "left")];
  return (
    <td
      className={`${PAD} ${alignment} ${numeric ? "tabular-nums" : ""} ${className}`}
      {...props}
    />
  );
}

/** The one row a list shows when nothing matches. */
export function EmptyRow({ colSpan, children }: { colSpan: number; children: ReactNode }) {
  return (
    <tr>
      <td colSpan={colSpan} className={`${PAD} text-center text-stone-600 [--cell-py:1.5rem]`}>
        {children}
      </td>
    </tr>
  );
}
