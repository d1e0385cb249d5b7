"use client";

import { ArrowDown, ArrowUp, Plus, Trash2 } from "lucide-react";
import { useState, type ReactNode } from "react";
import {
  appendRow,
  moveRow,
  removeRow,
  rowsOf,
  updateRow,
  valuesOf,
  type Row,
  type RowChange,
} from "@/lib/forms/rows";
import { Button } from "./button";

export interface RowList<T> {
  rows: Row<T>[];
  values: T[];
  add: (value: T) => void;
  remove: (index: number) => void;
  update: (index: number, change: RowChange<T>) => void;
  move: (index: number, by: -1 | 1) => void;
}

/** A list of editable rows held in the browser; the editor submits `values` in its payload. */
export function useRowList<T>(initial: () => readonly T[]): RowList<T> {
  const [rows, setRows] = useState(() => rowsOf(initial()));
  return {
    rows,
    values: valuesOf(rows),
    add: (value) => setRows((all) => appendRow(all, value)),
    remove: (index) => setRows((all) => removeRow(all, index)),
    update: (index, change) => setRows((all) => updateRow(all, index, change)),
    move: (index, by) => setRows((all) => moveRow(all, index, by)),
  };
}

/**
 * The editor's state as the one form field the server reads (`readJsonPayload`). Its inputs
 * carry no names of their own, so nothing but this field is submitted; their errors come back
 * under the schema's paths ("rows.0.testType") and each control shows its own by `errorKey`.
 */
export function PayloadField({ value }: { value: unknown }) {
  return <input type="hidden" name="payload" value={JSON.stringify(value)} />;
}

/** "Add …" under a list. */
export function AddRowButton({
  onAdd,
  children,
  className,
}: {
  onAdd: () => void;
  children: ReactNode;
  className?: string;
}) {
  return (
    <Button variant="secondary" className={className} onClick={onAdd}>
      <Plus className="h-4 w-4" aria-hidden="true" /> {children}
    </Button>
  );
}

/** A row's remove button: `label` names the row for screen readers; `children` is any visible text. */
export function RemoveRowButton({
  onRemove,
  label,
  children,
}: {
  onRemove: () => void;
  label: string;
  children?: ReactNode;
}) {
  return (
    <Button variant="ghost" aria-label={label} onClick={onRemove}>
      <Trash2 className="h-4 w-4" aria-hidden="true" />
      {children}
    </Button>
  );
}

/** Up and down buttons for a list whose order means something (stages in process order); `label` names the row. */
export function MoveRowButtons({
  onMove,
  label,
  first,
  last,
}: {
  onMove: (by: -1 | 1) => void;
  label: string;
  first: boolean;
  last: boolean;
}) {
  return (
    <span className="inline-flex gap-1">
      <Button
        variant="ghost"
        aria-label={`Move ${label} up`}
        disabled={first}
        onClick={() => onMove(-1)}
      >
        <ArrowUp className="h-4 w-4" aria-hidden="true" />
      </Button>
      <Button
        variant="ghost"
        aria-label={`Move ${label} down`}
        disabled={last}
        onClick={() => onMove(1)}
      >
        <ArrowDown className="h-4 w-4" aria-hidden="true" />
      </Button>
    </span>
  );
}
