import Papa from "papaparse";
import type { Readable } from "node:stream";
import type { z } from "zod";
import {
  CLASS_KEYS,
  gravimetricSampleSchema,
  particleSampleSchema,
  type GravimetricSample,
  type ParticleSample,
} from "@/lib/schemas/evidence";
import { formulaProblem } from "./files";

/**
 * Our CSV formats for samples: one row per sample, a header row with
 * these column names (any order, case-insensitive), comma or semicolon
 * separated, UTF-8. Particle counts are absolute (as counted on the membrane),
 * whole numbers, an empty cell being 0; weighings are in mg. An empty
 * component count is 1. Files with other column names are mapped to these
 * fields in a step before import.
 */
const SAMPLE_FIELDS = [
  {
    key: "sample",
    label: "Sample (part serial)",
    aliases: ["sample", "sample_label", "serial", "part_serial"],
  },
  {
    key: "cycle",
    label: "Wash cycle id",
    aliases: ["cycle", "cycle_id", "cycle_number", "wash_cycle"],
  },
  {
    key: "basket_position",
    label: "Basket position",
    aliases: ["basket_position", "position", "basket"],
  },
  {
    key: "worst_case",
    label: "Worst-case position (yes/no)",
    aliases: ["worst_case", "worstcase"],
  },
  {
    key: "components",
    label: "Components in the sample",
    aliases: ["components", "parts", "n_components"],
  },
] as const;

const PARTICLE_FIELDS = [
  ...SAMPLE_FIELDS,
  ...CLASS_KEYS.map((k) => ({
    key: k,
    label: `Class ${k} count`,
    aliases: [k.toLowerCase(), `class_${k.toLowerCase()}`],
  })),
  {
    key: "largest_metallic_um",
    label: "Largest metallic particle (µm)",
    aliases: ["largest_metallic_um", "max_metallic_um"],
  },
  {
    key: "largest_non_metallic_um",
    label: "Largest non-metallic particle (µm)",
    aliases: ["largest_non_metallic_um", "max_non_metallic_um"],
  },
  {
    key: "largest_fibre_um",
    label: "Largest fibre (µm)",
    aliases: ["largest_fibre_um", "largest_fiber_um", "max_fibre_um"],
  },
] as const;

const GRAVIMETRIC_FIELDS = [
  ...SAMPLE_FIELDS,
  {
    key: "filter_before_mg",
    label: "Filter mass before (mg)",
    aliases: ["filter_before_mg", "before_mg", "tare_mg"],
  },
  {
    key: "filter_after_mg",
    label: "Filter mass after (mg)",
    aliases: ["filter_after_mg", "after_mg", "gross_mg"],
  },
  { key: "blank_mg", label: "Blank residue (mg)", aliases: ["blank_mg", "blank_residue_mg"] },
] as const;

export type CsvFieldKey =
  (typeof PARTICLE_FIELDS)[number]["key"] | (typeof GRAVIMETRIC_FIELDS)[number]["key"];
/** Our field → the file's column header. */
export type ColumnMapping = Partial<Record<CsvFieldKey, string>>;
type Cell = (k: CsvFieldKey) => string | undefined;

const yes = (v: string | undefined) => (v ? /^(y|yes|true|1|x)$/i.test(v.trim()) : false);
const sampleBase = (get: Cell) => ({
  sampleLabel: get("sample"),
  cycleNumber: get("cycle"),
  basketPosition: get("basket_position"),
  worstCase: yes(get("worst_case")),
  components: get("components") || "1",
});

/** The test types whose samples can be imported, each with its columns, the columns it cannot do without, and its entry schema. */
export const CSV_FORMATS = {
  particle_cleanliness: {
    what: "particle counts",
    fields: PARTICLE_FIELDS,
    needs: [
      {
        keys: ["sample"],
        problem: 'No column holds the sample (part serial): name one "sample" or map it.',
      },
      {
        keys: CLASS_KEYS,
        problem:
          "No column holds a size-class count (B … N): name them by their class letters or map them.",
      },
    ],
    schema: particleSampleSchema,
    toSample: (get: Cell) => ({
      ...sampleBase(get),
      counts: Object.fromEntries(CLASS_KEYS.map((k) => [k, get(k)])),
      splitMeasured: false,
      largest: {
        metallicUm: get("largest_metallic_um"),
        nonMetallicUm: get("largest_non_metallic_um"),
        fibreUm: get("largest_fibre_um"),
      },
    }),
  },
  gravimetric: {
    what: "filter weighings",
    fields: GRAVIMETRIC_FIELDS,
    needs: [
      {
        keys: ["sample"],
        problem: 'No column holds the sample (part serial): name one "sample" or map it.',
      },
      {
        keys: ["filter_before_mg"],
        problem:
          'No column holds the filter mass before filtration: name one "filter_before_mg" or map it.',
      },
      {
        keys: ["filter_after_mg"],
        problem:
          'No column holds the filter mass after filtration: name one "filter_after_mg" or map it.',
      },
    ],
    schema: gravimetricSampleSchema,
    toSample: (get: Cell) => ({
      ...sampleBase(get),
      filterBeforeMg: get("filter_before_mg"),
      filterAfterMg: get("filter_after_mg"),
      blankMg: get("blank_mg"),
    }),
  },
} as const satisfies Record<
  string,
  {
    what: string;
    fields: readonly { key: CsvFieldKey; label: string; aliases: readonly string[] }[];
    needs: readonly { keys: readonly CsvFieldKey[]; problem: string }[];
    schema: z.ZodType;
    toSample: (get: Cell) => unknown;
  }
>;
export type CsvTestType = keyof typeof CSV_FORMATS;
export type CsvSample = ParticleSample | GravimetricSample;

export function isCsvTestType(testType: string): testType is CsvTestType {
  return Object.hasOwn(CSV_FORMATS, testType);
}

export interface RowError {
  /** Line in the file, the header being line 1. */
  line: number;
  message: string;
}

export interface CsvImportResult {
  headers: string[];
  rows: CsvSample[];
  rowCount: number;
  errors: RowError[];
  /** Problems with the file as a whole (empty, columns missing). */
  fileErrors: string[];
  errorCount: number;
}

const norm = (h: string) =>
  h
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, "_");

/** Maps the file's headers to our fields by name and known aliases. */
export function autoMapping(
  headers: string[],
  testType: CsvTestType = "particle_cleanliness",
): ColumnMapping {
  const mapping: ColumnMapping = {};
  for (const field of CSV_FORMATS[testType].fields) {
    const hit = headers.find(
      (h) => (field.aliases as readonly string[]).includes(norm(h)) || norm(h) === norm(field.key),
    );
    if (hit !== undefined) mapping[field.key] = hit;
  }
  return mapping;
}

/** What is wrong with a mapping before any row is read. */
export function mappingProblems(
  mapping: ColumnMapping,
  headers: string[],
  testType: CsvTestType = "particle_cleanliness",
): string[] {
  const problems: string[] = [];
  for (const [key, header] of Object.entries(mapping)) {
    if (header && !headers.includes(header))
      problems.push(`The column "${header}" chosen for ${key} is not in the file.`);
  }
  for (const need of CSV_FORMATS[testType].needs)
    if (!need.keys.some((k) => mapping[k])) problems.push(need.problem);
  const used = Object.values(mapping).filter(Boolean);
  const twice = used.find((h, i) => used.indexOf(h) !== i);
  if (twice) problems.push(`The column "${twice}" is mapped to two fields.`);
  return problems;
}

/** Rows validated between two turns of the event loop: a few milliseconds of work at a time. */
export const YIELD_EVERY_ROWS = 500;

/**
 * Reads a sample CSV (particle counts by default) as a stream, row by row, so a large file is never
 * held whole in memory; every row is validated with the same schema as the
 * entry form. Rows are collected only while the file is still valid, and the
 * caller saves nothing unless `errors` and `fileErrors` are both empty.
 */
export function parseSampleCsv(
  input: Readable | string,
  opts: {
    testType?: CsvTestType;
    mapping?: ColumnMapping;
    maxErrors?: number;
    maxRows?: number;
    collect?: boolean;
    onRow?: (rowCount: number) => void;
  } = {},
): Promise<CsvImportResult> {
  const testType = opts.testType ?? "particle_cleanliness";
  const format: { schema: z.ZodType<CsvSample>; toSample: (get: Cell) => unknown } =
    CSV_FORMATS[testType];
  const maxErrors = opts.maxErrors ?? 50;
  const collect = opts.collect ?? true;
  const result: CsvImportResult = {
    headers: [],
    rows: [],
    rowCount: 0,
    errors: [],
    fileErrors: [],
    errorCount: 0,
  };
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
          mapping = opts.mapping ?? autoMapping(result.headers, testType);
          result.fileErrors.push(...mappingProblems(mapping, result.headers, testType));
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
          if (mark)
            fail(
              line,
              `Column "${column}" starts with "${mark}", which a spreadsheet would run as a formula.`,
            );
        }
        const m: ColumnMapping = mapping;
        const parsed = format.schema.safeParse(
          format.toSample((k) => (m[k] ? row[m[k]!] : undefined)),
        );
        if (!parsed.success) {
          for (const issue of parsed.error.issues) fail(line, issue.message);
          return;
        }
        if (seen.has(parsed.data.sampleLabel))
          fail(line, `Sample "${parsed.data.sampleLabel}" appears twice in the file.`);
        seen.add(parsed.data.sampleLabel);
        // Once the file is known to be invalid its rows will not be saved: stop keeping them.
        if (collect && result.errorCount === 0) result.rows.push(parsed.data);
        // Text already in memory is parsed in one go: let other requests run between batches of rows. A
        // stream turns the event loop between its chunks by itself, and pausing it would read it ahead whole.
        if (typeof input === "string" && result.rowCount % YIELD_EVERY_ROWS === 0) {
          parser.pause();
          setTimeout(() => parser.resume(), 0);
        }
      },
      complete() {
        if (mapping === null && result.fileErrors.length === 0)
          result.fileErrors.push(
            sawText
              ? "The file has a header row but no data rows."
              : "The file is empty: it has no header row and no data.",
          );
        else if (result.rowCount === 0 && result.fileErrors.length === 0)
          result.fileErrors.push("The file has a header row but no data rows.");
        if (result.errorCount > 0 || result.fileErrors.length > 0) result.rows = [];
        resolve(result);
      },
      error(error: Error) {
        reject(error);
      },
    });
  });
}
