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
  if (/[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/.test(text)) return null;
  // Markup is text too, but a browser would run it: never take it for a table.
  return markupKind(text) ? null : "csv";
}

const HTML_START =
  /^\s*(<!--[\s\S]*?-->\s*)*<(!doctype\s+html|html|head|body|script|meta|iframe|div|p|a|table|style|link|title|img|form)\b/i;
const SVG_START = /^\s*(<\?xml[^>]*>\s*)?(<!--[\s\S]*?-->\s*)*(<!doctype\s+svg[^>]*>\s*)?<svg\b/i;

function markupKind(text: string): string | null {
  const head = text.replace(/^\uFEFF/, "").slice(0, 4096);
  if (SVG_START.test(head)) return "an SVG image";
  if (HTML_START.test(head)) return "an HTML page";
  if (/^\s*<\?xml\b/i.test(head)) return "an XML document";
  return null;
}

/** Signatures of common files we do not accept, so a refusal can say what the file is. */
const OTHER_SIGNATURES: [number[], string][] = [
  [[0x4d, 0x5a], "a Windows program"],
  [[0x7f, 0x45, 0x4c, 0x46], "a Linux program"],
  [[0x50, 0x4b, 0x03, 0x04], "a ZIP archive (or an Office document)"],
  [[0xd0, 0xcf, 0x11, 0xe0], "an older Office document"],
  [[0x47, 0x49, 0x46, 0x38], "a GIF image"],
  [[0x49, 0x49, 0x2a, 0x00], "a TIFF image"],
  [[0x4d, 0x4d, 0x00, 0x2a], "a TIFF image"],
  [[0x7b, 0x5c, 0x72, 0x74, 0x66], "an RTF document"],
];

/** What the bytes are, in words, for a refusal ("an HTML page", "plain text"); "an unrecognised kind of file" when nothing fits. */
export function describeContents(bytes: Uint8Array): string {
  // Signatures first: some ("GIF89a") are plain ASCII and would otherwise read as text.
  if (
    startsWith(bytes, [0x52, 0x49, 0x46, 0x46]) &&
    String.fromCharCode(...bytes.slice(8, 12)) === "WEBP"
  )
    return "a WebP image";
  for (const [sig, what] of OTHER_SIGNATURES) if (startsWith(bytes, sig)) return what;
  const accepted = detectType(bytes);
  if (accepted) return accepted === "csv" ? "plain text" : `a ${ACCEPTED_TYPES[accepted].label}`;
  try {
    const text = new TextDecoder("utf-8", { fatal: true }).decode(bytes.slice(0, 4096));
    const markup = markupKind(text);
    if (markup) return markup;
  } catch {
    // not text
  }
  return "an unrecognised kind of file";
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
  if (/[\u0000-\u001f\u007f]/.test(name))
    throw new FileCheckError(
      "The file name contains control characters. Rename the file and upload it again.",
    );
  if (/[/\\]/.test(name) || name.includes("..")) {
    throw new FileCheckError(
      `The file name "${raw.slice(0, 80)}" contains a folder path ("/", "\\" or ".."). Rename the file and upload it again.`,
    );
  }
  if (name.startsWith("."))
    throw new FileCheckError(
      `The file name "${raw.slice(0, 80)}" starts with a dot. Rename the file and upload it again.`,
    );
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
  return first && "=+-@".includes(first)
    ? first
    : /^[\t\r]/.test(cell)
      ? "a tab or carriage return"
      : null;
}

/** Every cell of a CSV file that starts like a formula, with its row and column. */
export function findFormulaCells(text: string, limit = 20): string[] {
  const problems: string[] = [];
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
  parsed.data.forEach((row, r) =>
    row.forEach((cell, c) => {
      const mark = formulaProblem(cell);
      if (mark && problems.length < limit)
        problems.push(`row ${r + 1}, column ${c + 1} starts with "${mark}"`);
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
export function checkUpload(input: {
  name: string;
  bytes: Uint8Array;
  maxBytes: number;
}): CheckedFile {
  if (input.bytes.byteLength > input.maxBytes) {
    throw new FileCheckError(
      `The file is ${formatSize(input.bytes.byteLength)}; the limit is ${formatSize(input.maxBytes)}.`,
      "too_large",
    );
  }
  if (input.bytes.byteLength === 0) throw new FileCheckError("The file is empty.");
  const name = sanitizeFileName(input.name);
  const ext = extensionOf(name);
  const claimed = (Object.keys(ACCEPTED_TYPES) as AcceptedType[]).find((t) =>
    (ACCEPTED_TYPES[t].extensions as readonly string[]).includes(ext),
  );
  if (!claimed)
    throw new FileCheckError(`"${name}" is not a PDF, PNG, JPEG or CSV file (by its extension).`);
  const actual = detectType(input.bytes);
  if (actual !== claimed) {
    // Name what the file is ("an HTML page"), never a type it was only mistaken for.
    const what = describeContents(input.bytes);
    const accepted = actual !== null && actual !== "csv";
    throw new FileCheckError(
      `"${name}" is named as a ${ACCEPTED_TYPES[claimed].label}, but its contents are ${what}${accepted ? "" : ", not a PDF, PNG, JPEG or CSV file"}. Nothing was stored.`,
    );
  }
  if (actual === "csv") {
    const formulas = findFormulaCells(new TextDecoder().decode(input.bytes));
    if (formulas.length > 0) {
      throw new FileCheckError(
        `"${name}" has cells that a spreadsheet would run as formulas (${formulas.slice(0, 5).join("; ")}). Remove the leading = + - @ and upload again. Nothing was stored.`,
      );
    }
  }
  return { type: actual, mime: ACCEPTED_TYPES[actual].mime, name };
}
