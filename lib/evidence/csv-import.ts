import Papa from "papaparse";
import type { Readable } from "node:stream";
import { CLASS_KEYS, particleSampleSchema, type ParticleSample } from "@/lib/schemas/evidence";
import { formulaProblem } from "./files";

/**
 * Our CSV format for particle counts: one row per sample, a header row with
 * these column names (any order, case-insensitive), comma or semicolon
 * separated, UTF-8. Counts are absolute (as counted on the membrane), whole
 * numbers; an empty cell is 0. Files with other column names are mapped to
 * these fields in a step before import.
 */
export const CSV_FIELDS = [
  { key: "sample", label: "Sample (part serial)", required: true, aliases: ["sample", "sample_label", "serial", "part_serial"] },
  { key: "basket_position", label: "Basket position", required: false, aliases: ["basket_position", "position", "basket"] },
  { key: "worst_case", label: "Worst-case position (yes/no)", required: false, aliases: ["worst_case", "worstcase"] },
  { key: "components", label: "Components in the sample", required: false, aliases: ["components", "parts", "n_components"] },
  ...CLASS_KEYS.map((k) => ({ key: k, label: `Class ${k} count`, required: false, aliases: [k.toLowerCase(), `class_${k.toLowerCase()}`] })),
  { key: "largest_metallic_um", label: "Largest metallic particle (µm)", required: false, aliases: ["largest_metallic_um", "max_metallic_um"] },
  { key: "largest_non_metallic_um", label: "Largest non-metallic particle (µm)", required: false, aliases: ["largest_non_metallic_um", "max_non_metallic_um"] },
  { key: "largest_fibre_um", label: "Largest fibre (µm)", required: false, aliases: ["largest_fibre_um", "largest_fiber_um", "max_fibre_um"] },
] as const;
export type CsvFieldKey = (typeof CSV_FIELDS)[number]["key"];
/** Our field → the file's column header. */
export type ColumnMapping = Partial<Record<CsvFieldKey, string>>;

export interface RowError {
  /** Line in the file, the header being line 1. */
  line: number;
  message: string;
}

export interface CsvImportResult {
  headers: string[];
  rows: ParticleSample[];
  rowCount: number;
  errors: RowError[];
  /** Problems with the file as a whole (empty, columns missing). */
  fileErrors: string[];
  errorCount: number;
}

const norm = (h: string) => h.trim().toLowerCase().replace(/[\s-]+/g, "_");

/** Maps the file's headers to our fields by name and known aliases. */
export function autoMapping(headers: string[]): ColumnMapping {
  const mapping: ColumnMapping = {};
  for (const field of CSV_FIELDS) {
    const hit = headers.find((h) => (field.aliases as readonly string[]).includes(norm(h)) || norm(h) === norm(field.key));
    if (hit !== undefined) mapping[field.key] = hit;
  }
  return mapping;
}

/** What is wrong with a mapping before any row is read. */
export function mappingProblems(mapping: ColumnMapping, headers: string[]): string[] {
  const problems: string[] = [];
  for (const [key, header] of Object.entries(mapping)) {
    if (header && !headers.includes(header)) problems.push(`The column "${header}" chosen for ${key} is not in the file.`);
  }
  if (!mapping.sample) problems.push('No column holds the sample (part serial): name one "sample" or map it.');
  if (!CLASS_KEYS.some((k) => mapping[k])) problems.push("No column holds a size-class count (B … N): name them by their class letters or map them.");
  const used = Object.values(mapping).filter(Boolean);
  const twice = used.find((h, i) => used.indexOf(h) !== i);
  if (twice) problems.push(`The column "${twice}" is mapped to two fields.`);
  return problems;
}

function rowToSample(row: Record<string, string>, m: ColumnMapping): unknown {
  const get = (k: CsvFieldKey) => (m[k] ? row[m[k]!] : undefined);
  const yes = (v: string | undefined) => (v ? /^(y|yes|true|1|x)$/i.test(v.trim()) : false);
  return {
    sampleLabel: get("sample"),
    basketPosition: get("basket_position"),
    worstCase: yes(get("worst_case")),
    components: get("components") || "1",
    counts: Object.fromEntries(CLASS_KEYS.map((k) => [k, get(k)])),
    splitMeasured: false,
    largest: { metallicUm: get("largest_metallic_um"), nonMetallicUm: get("largest_non_metallic_um"), fibreUm: get("largest_fibre_um") },
  };
}

/**
 * Reads a particle-count CSV as a stream, row by row, so a large file is never
 * held whole in memory; every row is validated with the same schema as the
 * entry form. Rows are collected only while the file is still valid, and the
 * caller saves nothing unless `errors` and `fileErrors` are both empty.
 */
export function parseParticleCsv(
  input: Readable | string,
  opts: { mapping?: ColumnMapping; maxErrors?: number; maxRows?: number; collect?: boolean; onRow?: (rowCount: number) => void } = {},
): Promise<CsvImportResult> {
  const maxErrors = opts.maxErrors ?? 50;
  const collect = opts.collect ?? true;
  const result: CsvImportResult = { headers: [], rows: [], rowCount: 0, errors: [], fileErrors: [], errorCount: 0 };
  let mapping: ColumnMapping | null = null;
  let sawText = false;
  const seen = new Set<string>();
  const fail = (line: number, message: string) => {
    result.errorCount += 1;
    if (result.errors.length < maxErrors) result.errors.push({ line, message });
  };

  return new Promise((resolve, reject) => {
    Papa.parse<Record<string, string>>(input as never, {
      header: true,
      skipEmptyLines: "greedy",
      transformHeader: (h: string) => h.trim(),
      beforeFirstChunk(chunk) {
        sawText = chunk.trim() !== "";
      },
      step(step, parser) {
        if (mapping === null) {
          result.headers = step.meta.fields ?? [];
          mapping = opts.mapping ?? autoMapping(result.headers);
          result.fileErrors.push(...mappingProblems(mapping, result.headers));
          if (result.fileErrors.length > 0) {
            parser.abort();
            return;
          }
        }
        result.rowCount += 1;
        opts.onRow?.(result.rowCount);
        const line = result.rowCount + 1;
        if (opts.maxRows && result.rowCount > opts.maxRows) {
          result.fileErrors.push(`The file has more than ${opts.maxRows} rows; split it.`);
          parser.abort();
          return;
        }
        for (const e of step.errors) fail(line, e.message);
        const row = step.data;
        for (const [column, cell] of Object.entries(row)) {
          const mark = typeof cell === "string" ? formulaProblem(cell) : null;
          if (mark) fail(line, `Column "${column}" starts with "${mark}", which a spreadsheet would run as a formula.`);
        }
        const parsed = particleSampleSchema.safeParse(rowToSample(row, mapping));
        if (!parsed.success) {
          for (const issue of parsed.error.issues) fail(line, issue.message);
          return;
        }
        if (seen.has(parsed.data.sampleLabel)) fail(line, `Sample "${parsed.data.sampleLabel}" appears twice in the file.`);
        seen.add(parsed.data.sampleLabel);
        // Once the file is known to be invalid its rows will not be saved: stop keeping them.
        if (collect && result.errorCount === 0) result.rows.push(parsed.data);
      },
      complete() {
        if (mapping === null && result.fileErrors.length === 0) result.fileErrors.push(sawText ? "The file has a header row but no data rows." : "The file is empty: it has no header row and no data.");
        else if (result.rowCount === 0 && result.fileErrors.length === 0) result.fileErrors.push("The file has a header row but no data rows.");
        if (result.errorCount > 0 || result.fileErrors.length > 0) result.rows = [];
        resolve(result);
      },
      error(error: Error) {
        reject(error);
      },
    });
  });
}
