/**
 * Rows of an editor that keeps a list in the browser and submits it as one JSON payload
 * (recipe stages and parameters, matrix rows, washer stages). Each row carries a key of its
 * own, so React keeps a row's inputs with the row when one above it is removed, and the key
 * never reaches the payload.
 */
export interface Row<T> {
  readonly key: string;
  readonly value: T;
}

let sequence = 0;

export function newRow<T>(value: T): Row<T> {
  sequence += 1;
  return { key: `row-${sequence}`, value };
}

export function rowsOf<T>(values: readonly T[]): Row<T>[] {
  return values.map((v) => newRow(v));
}

/** The values in order, without the keys: what the payload carries. */
export function valuesOf<T>(rows: readonly Row<T>[]): T[] {
  return rows.map((r) => r.value);
}

export function appendRow<T>(rows: readonly Row<T>[], value: T): Row<T>[] {
  return [...rows, newRow(value)];
}

export function removeRow<T>(rows: readonly Row<T>[], index: number): Row<T>[] {
  return rows.filter((_, i) => i !== index);
}

/** A patch merges into an object row; a function replaces the row's value. The key stays. */
export type RowChange<T> = Partial<T> | ((value: T) => T);

export function updateRow<T>(
  rows: readonly Row<T>[],
  index: number,
  change: RowChange<T>,
): Row<T>[] {
  return rows.map((row, i) =>
    i === index
      ? {
          key: row.key,
          value: typeof change === "function" ? change(row.value) : { ...row.value, ...change },
        }
      : row,
  );
}

/** Swaps a row with its neighbour (`by` -1 up, +1 down); the keys travel with the rows. Off the ends it changes nothing. */
export function moveRow<T>(rows: readonly Row<T>[], index: number, by: -1 | 1): Row<T>[] {
  const to = index + by;
  if (index < 0 || index >= rows.length || to < 0 || to >= rows.length) return [...rows];
  const next = [...rows];
  [next[index], next[to]] = [next[to], next[index]];
  return next;
}
