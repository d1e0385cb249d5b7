import { z } from "zod";

/**
 * What a person may store as text. SQLite keeps a NUL but reads the text back cut
 * at it, and UTF-8 cannot hold a lone surrogate (it comes back as U+FFFD): either
 * would make a stored value, and its audit hash, differ from what was typed.
 * Other control characters are invisible on screen and in printouts, so they are
 * refused as well; tab and line breaks are text. Format characters such as a
 * right-to-left override round-trip unchanged and are kept.
 */
export const TEXT_CONTROL_MESSAGE =
  "Remove the invisible control characters: only tabs and line breaks can be stored.";
export const TEXT_SURROGATE_MESSAGE =
  "Part of this text is a broken character (half of an emoji or symbol): retype it.";

// Cc (C0, DEL, C1) apart from tab and line feed; carriage returns are normalised away first.
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/u;

/** Textareas send CRLF; the stored text keeps one line-break form, so equal text hashes equal. */
export const normaliseLineBreaks = (s: string) => s.replace(/\r\n?/g, "\n");

/** Why this text cannot be stored as typed, or null when it round-trips. */
export function storedTextProblem(s: string): string | null {
  if (!s.isWellFormed()) return TEXT_SURROGATE_MESSAGE;
  if (CONTROL.test(s)) return TEXT_CONTROL_MESSAGE;
  return null;
}

/** True when the database gives back exactly this text. */
export const isStorableText = (s: string) => storedTextProblem(s) === null;

/**
 * The one schema for stored text: line breaks normalised, then refused with a plain
 * message beside the field when it would not read back as typed. Chain `.trim()`,
 * `.min()`, `.max()` on it as on `z.string()`.
 */
export function storedText(params?: Parameters<typeof z.string>[0]) {
  return z
    .string(params)
    .overwrite(normaliseLineBreaks)
    .check((ctx) => {
      const problem = storedTextProblem(ctx.value);
      if (problem) ctx.issues.push({ code: "custom", message: problem, input: ctx.value });
    });
}

/** The reason a change gives the audit trail: a person reading the record later must learn why. */
export const auditReason = () =>
  storedText().trim().min(5, "Give the reason for the record (at least 5 characters).").max(1000);

/** A reason the service may require only for some changes (a role change, an interval that already had a value). */
export const optionalAuditReason = () =>
  storedText()
    .trim()
    .max(1000)
    .optional()
    .transform((v) => v || null);

/**
 * The narrower test the audit chain applies to every text it hashes: SQLite hands
 * back exactly this string (no NUL, no lone surrogate). Other control characters
 * do round-trip, so a direct caller may still store them.
 */
export const readsBackUnchanged = (s: string) => s.isWellFormed() && !s.includes("\u0000");
