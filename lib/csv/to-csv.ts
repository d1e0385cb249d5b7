import Papa from "papaparse";

/**
 * CSV for spreadsheets. Cells that a spreadsheet would run as a formula
 * (starting with = + - @, tab or carriage return) are prefixed with a quote.
 * The pattern is ours, not the library's default, which misses a cell that
 * starts like a formula and goes on over several lines.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export function toCsv(header: string[], rows: (string | number | null)[][]): string {
  return Papa.unparse(
    { fields: header, data: rows.map((r) => r.map((c) => c ?? "")) },
    { escapeFormulae: FORMULA_START, newline: "\r\n" },
  );
}
