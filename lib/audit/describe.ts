import type { ReadAuditEvent } from "./read";

/** One changed field of an audit event, readable by a person. */
export interface FieldChange {
  field: string;
  old: string | null;
  new: string | null;
}

function show(value: unknown): string | null {
  if (value === undefined) return null;
  if (value === null) return "(empty)";
  if (typeof value === "string") return value;
  return JSON.stringify(value);
}

/** Lists old → new per field of a read event's values; unchanged fields are left out. */
export function describeChanges(values: Pick<ReadAuditEvent, "old" | "new">): FieldChange[] {
  // Every event's values are a flat-keyed object (or nothing); entries() reads any of them alike.
  const before = new Map(Object.entries(values.old ?? {}));
  const after = new Map(Object.entries(values.new ?? {}));
  const fields = [...new Set([...before.keys(), ...after.keys()])].sort();
  return fields
    .map((field) => ({ field, old: show(before.get(field)), new: show(after.get(field)) }))
    .filter((c) => c.old !== c.new);
}
