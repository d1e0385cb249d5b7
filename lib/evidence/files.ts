import Papa from "papaparse";
import { formatSize } from "@/lib/format/number";

/** The evidence file types we accept, recognised from their bytes. */
export const ACCEPTED_TYPES = {
  pdf: { mime: "application/pdf", extensions: ["pdf"], label: "PDF" },
  png: { mime: "image/png", extensions: ["png"], label: "PNG image" },
  jpeg: { mime: "image/jpeg", extensions: ["jpg", "jpeg"], label: "JPEG image" },
  csv: { mime: "text/csv", extensions: ["csv"], label: "CSV table" },
} as const;
export type AcceptedType = keyof typeof ACCEPTED_TYPES;

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const startsWith = (bytes: Uint8Array, sig: number[]) => sig.every((b, i) => bytes[i] === b);

/**
 * What the bytes are, from their signatures (PDF "%PDF-", PNG's eight-byte
 * signature, JPEG's SOI marker FF D8 FF); CSV has none, so it is accepted only
 * as valid UTF-8 text without NUL or other control characters.
 */
export function detectType(bytes: Uint8Array): AcceptedType | null {
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46, 0x2d])) return "pdf";
  if (startsWith(bytes, PNG)) return "png";
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return "jpeg";
  if (bytes.length === 0) return null;
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return null;
  }
  return /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(text) ? null : "csv";
}

export class FileCheckError extends Error {
  constructor(
    message: string,
    /** An over-size file is refused as too large (413); anything else as invalid. */
    readonly kind: "invalid" | "too_large" = "invalid",
  ) {
    super(message);
    this.name = "FileCheckError";
  }
}

const MAX_NAME = 120;

/**
 * Refuses names that try to leave the store (folders, "..", control characters)
 * with a clear message, then keeps letters, digits and a few safe marks. The
 * name is only a label: bytes are stored under their hash.
 */
export function sanitizeFileName(raw: string): string {
  const name = raw.normalize("NFC").trim();
  if (name === "") throw new FileCheckError("The file has no name.");
  // Control characters first, so no message below repeats one back.
  if (/[\u0000-\u001f\u007f]/.test(name)) throw new FileCheckError("The file name contains control characters. Rename the file and upload it again.");
  if (/[/\\]/.test(name) || name.includes("..")) {
    throw new FileCheckError(`The file name "${raw.slice(0, 80)}" contains a folder path ("/", "\\" or ".."). Rename the file and upload it again.`);
  }
  if (name.startsWith(".")) throw new FileCheckError(`The file name "${raw.slice(0, 80)}" starts with a dot. Rename the file and upload it again.`);
  const cleaned = name.replace(/[^\p{L}\p{N} ._()+-]/gu, "_").replace(/\s+/g, " ");
  if (cleaned.length <= MAX_NAME) return cleaned;
  const dot = cleaned.lastIndexOf(".");
  const ext = dot > 0 ? cleaned.slice(dot) : "";
  return cleaned.slice(0, MAX_NAME - ext.length) + ext;
}

export function extensionOf(name: string): string {
  const dot = name.lastIndexOf(".");
  return dot > 0 ? name.slice(dot + 1).toLowerCase() : "";
}

/** A cell a spreadsheet would run as a formula (CSV injection). */
export function formulaProblem(cell: string): string | null {
  const first = cell.trimStart().charAt(0);
  return first && "=+-@".includes(first) ? first : /^[\t\r]/.test(cell) ? "a tab or carriage return" : null;
}

/** Every cell of a CSV file that starts like a formula, with its row and column. */
export function findFormulaCells(text: string, limit = 20): string[] {
  const problems: string[] = [];
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
  parsed.data.forEach((row, r) =>
    row.forEach((cell, c) => {
      const mark = formulaProblem(cell);
      if (mark && problems.length < limit) problems.push(`row ${r + 1}, column ${c + 1} starts with "${mark}"`);
    }),
  );
  return problems;
}


export interface CheckedFile {
  type: AcceptedType;
  mime: string;
  name: string;
}

/**
 * Everything an upload must satisfy before a byte is stored: a size within the
 * limit, a safe name, bytes of an accepted type that matches the extension, and
 * for CSV no cell that a spreadsheet would execute.
 */
export function checkUpload(input: { name: string; bytes: Uint8Array; maxBytes: number }): CheckedFile {
  if (input.bytes.byteLength > input.maxBytes) {
    throw new FileCheckError(`The file is ${formatSize(input.bytes.byteLength)}; the limit is ${formatSize(input.maxBytes)}.`, "too_large");
  }
  if (input.bytes.byteLength === 0) throw new FileCheckError("The file is empty.");
  const name = sanitizeFileName(input.name);
  const ext = extensionOf(name);
  const claimed = (Object.keys(ACCEPTED_TYPES) as AcceptedType[]).find((t) => (ACCEPTED_TYPES[t].extensions as readonly string[]).includes(ext));
  if (!claimed) throw new FileCheckError(`"${name}" is not a PDF, PNG, JPEG or CSV file (by its extension).`);
  const actual = detectType(input.bytes);
  if (actual !== claimed) {
    throw new FileCheckError(
      `"${name}" is named as a ${ACCEPTED_TYPES[claimed].label}, but its contents are ${actual ? `a ${ACCEPTED_TYPES[actual].label}` : "not a PDF, PNG, JPEG or CSV file"}. Nothing was stored.`,
    );
  }
  if (actual === "csv") {
    const formulas = findFormulaCells(new TextDecoder().decode(input.bytes));
    if (formulas.length > 0) {
      throw new FileCheckError(`"${name}" has cells that a spreadsheet would run as formulas (${formulas.slice(0, 5).join("; ")}). Remove the leading = + - @ and upload again. Nothing was stored.`);
    }
  }
  return { type: actual, mime: ACCEPTED_TYPES[actual].mime, name };
}
