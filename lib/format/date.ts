/**
 * Dates as the app shows them. Every stored time is an ISO-8601 UTC string, and every screen, e-mail
 * and PDF shows it in UTC so that two sites in different zones read the same record alike: the
 * calendar date as YYYY-MM-DD (the house format) and a moment as "YYYY-MM-DD HH:mm UTC".
 * Plain Date arithmetic in UTC rather than date-fns' `format`, which formats in the machine's zone.
 */

const DATE_ONLY = /^\d{4}-\d{2}-\d{2}$/;
// A time with no zone ("2026-11-29T08:00", what a datetime-local field sends) is read as UTC, not as the machine's zone.
const NO_ZONE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?$/;

export type DateInput = string | Date | null | undefined;

/** The instant an input names, or null when it is empty or not a date. */
export function parseUtc(value: DateInput): Date | null {
  if (value === null || value === undefined || value === "") return null;
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : value;
  const text = value.trim();
  let date: Date;
  if (DATE_ONLY.test(text)) date = new Date(`${text}T00:00:00Z`);
  else if (NO_ZONE.test(text)) date = new Date(`${text}Z`);
  else if (/^\d{4}-\d{2}-\d{2}T/.test(text)) date = new Date(text);
  else return null; // only ISO-8601: Date's parser accepts "1" or "March 5" and guesses
  if (Number.isNaN(date.getTime())) return null;
  // Date rolls "2026-02-30" over to March; a calendar date that does not exist is invalid.
  if (date.toISOString().slice(0, 10) !== text.slice(0, 10) && !/[+-]\d{2}:?\d{2}$/.test(text))
    return null;
  return date;
}

/** Calendar date in UTC, "2026-06-15"; `fallback` for an empty or invalid input. */
export function formatDate(value: DateInput, fallback = "—"): string {
  const date = parseUtc(value);
  return date ? date.toISOString().slice(0, 10) : fallback;
}

export interface DateTimeOptions {
  /** Show seconds, as signatures and the audit trail do ("09:00:00"). */
  seconds?: boolean;
  /** Append " UTC"; leave it off only where the column heading already says "(UTC)". */
  zone?: boolean;
  fallback?: string;
}

/** A moment in UTC, "2026-06-15 07:00 UTC". */
export function formatDateTime(
  value: DateInput,
  { seconds = false, zone = true, fallback = "—" }: DateTimeOptions = {},
): string {
  const date = parseUtc(value);
  if (!date) return fallback;
  const text = date
    .toISOString()
    .replace("T", " ")
    .slice(0, seconds ? 19 : 16);
  return zone ? `${text} UTC` : text;
}

/** Today's calendar date in UTC, for date fields' defaults and "effective from today" comparisons. */
export function todayUtc(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** The value a `datetime-local` field takes for an instant, in UTC ("2026-06-15T07:00"); the form labels it "(UTC)". */
export function dateTimeFieldValue(now: Date = new Date()): string {
  return now.toISOString().slice(0, 16);
}

/** A file-name stamp, "20260615T070000Z". */
export function fileStamp(now: Date = new Date()): string {
  return now
    .toISOString()
    .replace(/[-:]/g, "")
    .replace(/\.\d+Z$/, "Z");
}
