import Papa from "papaparse";
import { formulaProblem } from "@/lib/evidence/files";
import { cycleInputSchema, splitLots, type CycleInput } from "@/lib/schemas/cycle";

/** One column of a washer's cycle log as we read it. */
export interface CycleCsvField {
  key: string;
  label: string;
  aliases: readonly string[];
}

/**
 * The fixed columns of a cycle log. The actual values follow as one column per recipe parameter,
 * named by its key ("wash.temperature") or mapped to it, so a washer's own export can be read as it is.
 */
export const CYCLE_FIELDS: readonly CycleCsvField[] = [
  { key: "cycle", label: "Cycle id", aliases: ["cycle", "cycle_id", "cycle_no", "cycle_number"] },
  { key: "system", label: "Washer (system code)", aliases: ["system", "washer", "machine"] },
  { key: "recipe", label: "Recipe code", aliases: ["recipe", "program", "programme"] },
  {
    key: "version",
    label: "Recipe version (optional: the one in force)",
    aliases: ["version", "recipe_version"],
  },
  { key: "part_family", label: "Part family code", aliases: ["part_family", "family"] },
  { key: "lots", label: "Lot numbers", aliases: ["lots", "lot", "lot_number", "lot_numbers"] },
  { key: "baskets", label: "Baskets", aliases: ["baskets", "basket_count", "loads"] },
  {
    key: "start",
    label: "Start (UTC unless zoned)",
    aliases: ["start", "started", "started_at", "start_time"],
  },
  { key: "end", label: "End", aliases: ["end", "ended", "ended_at", "end_time"] },
  { key: "operator", label: "Operator", aliases: ["operator", "badge", "user"] },
];

const REQUIRED = [
  "cycle",
  "system",
  "recipe",
  "part_family",
  "lots",
  "baskets",
  "start",
  "end",
  "operator",
];

/** A value column for each recipe parameter a cycle records. */
export function valueFields(
  parameters: { key: string; name: string; unit: string }[],
): CycleCsvField[] {
  return parameters.map((p) => ({
    key: `value:${p.key}`,
    label: `${p.name} (${p.unit}) — ${p.key}`,
    aliases: [p.key, p.key.replaceAll(".", "_")],
  }));
}

export type CycleMapping = Record<string, string | undefined>;

const norm = (h: string) =>
  h
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, "_");

export function autoMapCycles(headers: string[], fields: readonly CycleCsvField[]): CycleMapping {
  const mapping: CycleMapping = {};
  for (const f of fields) {
    const hit = headers.find(
      (h) => f.aliases.map(norm).includes(norm(h)) || norm(h) === norm(f.key),
    );
    if (hit !== undefined) mapping[f.key] = hit;
  }
  return mapping;
}

export function cycleMappingProblems(
  mapping: CycleMapping,
  headers: string[],
  fields: readonly CycleCsvField[],
): string[] {
  const problems: string[] = [];
  for (const [key, header] of Object.entries(mapping))
    if (header && !headers.includes(header))
      problems.push(`The column "${header}" chosen for ${key} is not in the file.`);
  for (const key of REQUIRED)
    if (!mapping[key])
      problems.push(
        `No column holds the ${fields.find((f) => f.key === key)?.label.toLowerCase() ?? key}: name one "${key}" or map it.`,
      );
  const used = Object.values(mapping).filter(Boolean);
  const twice = used.find((h, i) => used.indexOf(h) !== i);
  if (twice) problems.push(`The column "${twice}" is mapped to two fields.`);
  return problems;
}

export interface CycleCsvResult {
  rows: { line: number; cycle: CycleInput }[];
  rowCount: number;
  errors: { line: number; message: string }[];
  errorCount: number;
  fileErrors: string[];
}

const NUMBER = /^-?\d+(?:[.,]\d+)?$/;

/**
 * Reads a cycle log whole and validates every row with the same schema as the form and the API; the
 * caller records nothing unless the file and every row are valid (the service then checks the rows
 * against the plant, and its refusals come back by line too).
 */
export function parseCycleCsv(
  text: string,
  opts: {
    fields: readonly CycleCsvField[];
    mapping?: CycleMapping;
    maxRows?: number;
    maxErrors?: number;
  },
): CycleCsvResult {
  const result: CycleCsvResult = {
    rows: [],
    rowCount: 0,
    errors: [],
    errorCount: 0,
    fileErrors: [],
  };
  const maxErrors = opts.maxErrors ?? 50;
  const fail = (line: number, message: string) => {
    result.errorCount += 1;
    if (result.errors.length < maxErrors) result.errors.push({ line, message });
  };
  const parsed = Papa.parse<Record<string, string>>(text, {
    header: true,
    skipEmptyLines: "greedy",
    transformHeader: (h) => h.trim(),
  });
  const headers = parsed.meta.fields ?? [];
  if (text.trim() === "") {
    result.fileErrors.push("The file is empty: it has no header row and no data.");
    return result;
  }
  const mapping = opts.mapping ?? autoMapCycles(headers, opts.fields);
  result.fileErrors.push(...cycleMappingProblems(mapping, headers, opts.fields));
  if (result.fileErrors.length > 0) return result;
  if (parsed.data.length === 0) {
    result.fileErrors.push("The file has a header row but no data rows.");
    return result;
  }
  if (opts.maxRows && parsed.data.length > opts.maxRows) {
    result.fileErrors.push(`The file has more than ${opts.maxRows} rows; split it.`);
    return result;
  }
  const cell = (row: Record<string, string>, key: string) => {
    const header = mapping[key];
    const v = header ? row[header] : undefined;
    return v === undefined ? undefined : v.trim();
  };
  for (const e of parsed.errors) if (e.row !== undefined) fail(e.row + 2, e.message);
  for (const [i, row] of parsed.data.entries()) {
    const line = i + 2;
    result.rowCount += 1;
    let bad = false;
    for (const [column, value] of Object.entries(row)) {
      const mark =
        typeof value === "string" && !NUMBER.test(value.trim()) ? formulaProblem(value) : null;
      if (mark) {
        fail(
          line,
          `Column "${column}" starts with "${mark}", which a spreadsheet would run as a formula.`,
        );
        bad = true;
      }
    }
    const values: Record<string, number> = {};
    for (const f of opts.fields.filter((x) => x.key.startsWith("value:"))) {
      const v = cell(row, f.key);
      if (v === undefined || v === "") continue;
      if (!NUMBER.test(v)) {
        fail(line, `${f.label}: "${v}" is not a number.`);
        bad = true;
        continue;
      }
      values[f.key.slice("value:".length)] = Number(v.replace(",", "."));
    }
    const version = cell(row, "version");
    const baskets = cell(row, "baskets");
    const checked = cycleInputSchema.safeParse({
      cycleNumber: cell(row, "cycle"),
      system: cell(row, "system"),
      recipe: cell(row, "recipe"),
      ...(version ? { version: NUMBER.test(version) ? Number(version) : version } : {}),
      partFamily: cell(row, "part_family"),
      lots: splitLots(cell(row, "lots") ?? ""),
      baskets: baskets && NUMBER.test(baskets) ? Number(baskets) : baskets,
      startedAt: cell(row, "start"),
      endedAt: cell(row, "end"),
      operator: cell(row, "operator"),
      values,
    });
    if (!checked.success) {
      for (const issue of checked.error.issues)
        fail(
          line,
          `${FIELD_WORDS[String(issue.path[0])] ?? String(issue.path[0])}: ${issue.message}`,
        );
      continue;
    }
    if (!bad && result.errorCount === 0) result.rows.push({ line, cycle: checked.data });
  }
  if (result.errorCount > 0) result.rows = [];
  return result;
}

/** The service's field names as the log's reader knows them. */
export const FIELD_WORDS: Record<string, string> = {
  cycleNumber: "Cycle id",
  system: "Washer",
  recipe: "Recipe",
  version: "Recipe version",
  partFamily: "Part family",
  lots: "Lot numbers",
  baskets: "Baskets",
  startedAt: "Start",
  endedAt: "End",
  operator: "Operator",
  values: "Values",
};
