import { diffWords } from "diff";
import { formatDateTime } from "@/lib/format/date";
import { humanize } from "@/lib/format/labels";
import type { ReadAuditEvent } from "./read";

/** A piece of a word-level diff between an old and a new text. */
export interface WordPart {
  text: string;
  change: "added" | "removed" | null;
}

/** One changed field of an audit event, readable by a person. */
export interface FieldChange {
  /** The stored key, as the CSV export and the API carry it. */
  field: string;
  /** The key in words ("Part family" for partFamilyId). */
  label: string;
  old: string | null;
  new: string | null;
  /** Old and new texts word by word, when both are texts long enough for a diff to help. */
  words?: WordPart[];
}

/** Finds the number and name of a record ("TR-0007 · Particle cleanliness"), or undefined when unknown. */
export type RecordLabeller = (recordType: string, recordId: string) => string | undefined;

/** Payload keys that hold another record's id, and that record's type. */
export const ID_FIELD_TYPES: Record<string, string> = {
  partFamilyId: "part_family",
  recipeVersionId: "recipe_version",
  recipeId: "recipe",
  technicianId: "user",
  userId: "user",
  assigneeId: "user",
  runId: "test_run",
  detachedFromRunId: "test_run",
  changeRequestId: "change_request",
  protocolDocumentId: "document",
  documentId: "document",
  versionId: "document_version",
  specId: "cleanliness_spec",
  systemId: "cleaning_system",
  stageId: "system_stage",
};

/** Keys whose values are stored codes from a closed list ("particle_cleanliness"), shown in words. */
const CODE_FIELDS = new Set([
  "status",
  "testType",
  "kind",
  "meaning",
  "scope",
  "type",
  "outcome",
  "impact",
  "computed",
  "level",
  "state",
  "role",
  "roles",
]);

const WORDS: Record<string, string> = {
  sha256: "SHA-256",
  ccc: "CCC",
  mimeType: "File type",
};

/** "effectiveFrom" → "Effective from"; "partFamilyId" → "Part family". */
export function fieldLabel(field: string): string {
  if (WORDS[field]) return WORDS[field];
  const base = ID_FIELD_TYPES[field] ? field.replace(/Id$/, "") : field;
  const words = base
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .toLowerCase()
    .replace(/\bid\b/g, "ID")
    .replace(/\bpct\b/g, "%")
    .replace(/\bum\b/g, "µm")
    .replace(/\bcm2\b/g, "cm²")
    .replace(/\bus per cm\b/g, "µS/cm");
  return words.charAt(0).toUpperCase() + words.slice(1);
}

const ISO_INSTANT = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?Z$/;
const CODE = /^[a-z][a-z0-9]*(_[a-z0-9]+)*$/;

function readable(field: string, value: unknown, labelOf?: RecordLabeller): string {
  if (value === null || value === undefined || value === "") return "(empty)";
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (typeof value === "number") return String(value);
  if (typeof value === "string") {
    const type = ID_FIELD_TYPES[field];
    if (type) return labelOf?.(type, value) ?? value;
    if (ISO_INSTANT.test(value)) return formatDateTime(value, { seconds: true });
    if (CODE_FIELDS.has(field) && CODE.test(value)) return humanize(value);
    return value;
  }
  if (Array.isArray(value))
    return value.length === 0
      ? "(none)"
      : value.map((item) => readable(field, item, labelOf)).join("; ");
  if (typeof value === "object")
    return Object.entries(value as Record<string, unknown>)
      .map(([k, v]) => `${fieldLabel(k)}: ${readable(k, v, labelOf)}`)
      .join(", ");
  return String(value);
}

/** Word diffs help on prose (a reason, a description), not on a code or a number. */
function wordDiff(before: unknown, after: unknown): WordPart[] | undefined {
  if (typeof before !== "string" || typeof after !== "string") return undefined;
  if (!/\s/.test(before) && !/\s/.test(after)) return undefined;
  return diffWords(before, after).map((part) => ({
    text: part.value,
    change: part.added ? "added" : part.removed ? "removed" : null,
  }));
}

/** The other records an event's values name by id, so their labels can be looked up in one batch. */
export function referencedRecords(
  values: Pick<ReadAuditEvent, "old" | "new">,
): { recordType: string; recordId: string }[] {
  const found: { recordType: string; recordId: string }[] = [];
  for (const side of [values.old, values.new])
    for (const [field, value] of Object.entries(side ?? {}))
      if (ID_FIELD_TYPES[field] && typeof value === "string")
        found.push({ recordType: ID_FIELD_TYPES[field], recordId: value });
  return found;
}

/**
 * Lists old → new per field of a read event's values, in words: ids become the
 * records' numbers and names, lists and objects become text, and a changed text
 * comes with its word-level diff. Unchanged fields are left out.
 */
export function describeChanges(
  values: Pick<ReadAuditEvent, "old" | "new">,
  labelOf?: RecordLabeller,
): FieldChange[] {
  // Every event's values are a flat-keyed object (or nothing); entries() reads any of them alike.
  const before = new Map(Object.entries(values.old ?? {}));
  const after = new Map(Object.entries(values.new ?? {}));
  const fields = [...new Set([...before.keys(), ...after.keys()])].sort();
  return fields
    .filter((field) => JSON.stringify(before.get(field)) !== JSON.stringify(after.get(field)))
    .map((field) => {
      const change: FieldChange = {
        field,
        label: fieldLabel(field),
        old: before.has(field) ? readable(field, before.get(field), labelOf) : null,
        new: after.has(field) ? readable(field, after.get(field), labelOf) : null,
      };
      const words = wordDiff(before.get(field), after.get(field));
      if (words) change.words = words;
      return change;
    });
}
