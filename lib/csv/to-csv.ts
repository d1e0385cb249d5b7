import Papa from "papaparse";

/**
 * CSV for spreadsheets. Cells that a spreadsheet would run as a formula
 * (starting with = + - @, tab or carriage return) are prefixed with a quote.
 */
export function toCsv(header: string[], rows: (string | number | null)[][]): string {
  return Papa.unparse({ fields: header, data: rows.map((r) => r.map((c) => c ?? "")) }, { escapeFormulae: true, newline: "\r\n" });
}
