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

/** Lists old → new per field from the stored canonical JSON; unchanged fields are left out. */
export function describeChanges(oldJson: string | null, newJson: string | null): FieldChange[] {
  const before = oldJson ? (JSON.parse(oldJson) as Record<string, unknown>) : {};
  const after = newJson ? (JSON.parse(newJson) as Record<string, unknown>) : {};
  const fields = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
  return fields
    .map((field) => ({ field, old: show(before[field]), new: show(after[field]) }))
    .filter((c) => c.old !== c.new);
}
