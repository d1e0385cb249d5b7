import { z } from "zod";

/**
 * The one calendar-date rule for every date a person or a program enters: a real
 * day of the Gregorian calendar as YYYY-MM-DD. 2026-13-45 and 30 February are
 * refused, never rolled over into another day (as `new Date()` would).
 */
export const MIN_YEAR = 1900;
export const MAX_YEAR = 2999;

export function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

/** Why the text is not a calendar date, or null when it is one. */
export function calendarDateProblem(text: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return "Enter the date as YYYY-MM-DD, e.g. 2026-01-31.";
  const [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (year < MIN_YEAR || year > MAX_YEAR) return `Enter a year from ${MIN_YEAR} to ${MAX_YEAR}.`;
  if (month < 1 || month > 12) return `There is no month ${m[2]}: months run from 01 to 12.`;
  if (day < 1 || day > daysInMonth(year, month)) return `There is no such day: ${text}.`;
  return null;
}

/** Date followed by an optional time of day (HH:MM, 24-hour), as a datetime-local field sends it. */
export function calendarDateTimeProblem(text: string): string | null {
  const m = /^(\d{4}-\d{2}-\d{2})(?:T(\d{2}):(\d{2}))?$/.exec(text);
  if (!m) return "Enter the date as YYYY-MM-DD, with the time as HH:MM if you know it.";
  const dateProblem = calendarDateProblem(m[1]);
  if (dateProblem) return dateProblem;
  if (m[2] !== undefined && (Number(m[2]) > 23 || Number(m[3]) > 59))
    return `There is no such time: ${m[2]}:${m[3]}.`;
  return null;
}

function checked(problem: (text: string) => string | null, required: string) {
  return z
    .string({ error: required })
    .trim()
    .min(1, required)
    .superRefine((text, ctx) => {
      const message = problem(text);
      if (message) ctx.addIssue({ code: "custom", message });
    });
}

/** A required calendar date; `required` is the message when it is missing. */
export const calendarDate = (required = "Enter a date.") => checked(calendarDateProblem, required);

/** A required date with an optional time of day. */
export const calendarDateTime = (required = "Enter a date.") =>
  checked(calendarDateTimeProblem, required);

export const calendarDateSchema = calendarDate();
