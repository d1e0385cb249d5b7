"use client";

import { Plus, Trash2 } from "lucide-react";
import { useState, type ReactNode } from "react";
import {
  appendRow,
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
