import { z } from "zod";

/*
 * The one error map: every zod message a user can meet, in plain words with the limit.
 * A schema's own message (`.max(60, "Use at most 60 characters.")`) still wins; this covers
 * every check written without one, so zod's developer wording ("Too big: expected string to
 * have <=200 characters") never reaches a form or an API answer.
 *
 * Importing this module sets the map on zod's global configuration. Every schema module in
 * lib/schemas, the action result helpers and the form kit import it, so the map is in force on
 * the server and in the browser bundle alike.
 */

type Issue = z.core.$ZodRawIssue;

const grouped = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 6 });
const amount = (n: number | bigint) => (typeof n === "bigint" ? n.toString() : grouped.format(n));
const plural = (n: number | bigint, one: string, many = `${one}s`) =>
  `${amount(n)} ${Number(n) === 1 ? one : many}`;

const isMissing = (input: unknown) =>
  input === undefined || input === null || (typeof input === "string" && input.trim() === "");

const TYPE_WORDS: Record<string, string> = {
  number: "Enter a number.",
  int: "Enter a whole number.",
  bigint: "Enter a whole number.",
  string: "Enter text.",
  boolean: "Answer yes or no.",
  date: "Enter a date.",
  array: "Enter a list.",
  object: "Fill in this part of the form.",
};

const FORMAT_WORDS: Record<string, string> = {
  email: "Enter an e-mail address, like name@example.com.",
  url: "Enter a web address, like https://example.com.",
  uuid: "Choose from the list.",
  guid: "Choose from the list.",
  cuid: "Choose from the list.",
  cuid2: "Choose from the list.",
  nanoid: "Choose from the list.",
  ulid: "Choose from the list.",
  date: "Enter a date as YYYY-MM-DD.",
  datetime: "Enter a date and time as YYYY-MM-DDThh:mm.",
  time: "Enter a time as hh:mm.",
  duration: "Enter a duration.",
  ipv4: "Enter an IPv4 address.",
  ipv6: "Enter an IPv6 address.",
  base64: "Enter base64 text.",
  json_string: "Enter valid JSON.",
};

function tooBig(issue: Extract<Issue, { code: "too_big" }>): string {
  const max = issue.maximum;
  switch (issue.origin) {
    case "string":
      return `At most ${plural(max, "character")}.`;
    case "array":
    case "set":
      return `At most ${plural(max, "entry", "entries")}.`;
    case "file":
      return `At most ${plural(max, "byte")}.`;
    case "date":
      return "This date is too late.";
    default:
      return issue.inclusive === false ? `Less than ${amount(max)}.` : `At most ${amount(max)}.`;
  }
}

function tooSmall(issue: Extract<Issue, { code: "too_small" }>): string {
  const min = issue.minimum;
  switch (issue.origin) {
    case "string":
      return Number(min) <= 1 ? "Fill in this field." : `At least ${plural(min, "character")}.`;
    case "array":
    case "set":
      return Number(min) <= 1
        ? "Choose or enter at least one."
        : `At least ${plural(min, "entry", "entries")}.`;
    case "file":
      return "The file is empty.";
    case "date":
      return "This date is too early.";
    default:
      return issue.inclusive === false ? `More than ${amount(min)}.` : `At least ${amount(min)}.`;
  }
}

function invalidValue(values: readonly unknown[]): string {
  const shown = values.filter(
    (v) => typeof v === "string" || typeof v === "number" || typeof v === "boolean",
  );
  if (shown.length === 1) return `Must be ${String(shown[0])}.`;
  if (shown.length > 0 && shown.length <= 6) return `Choose one of: ${shown.join(", ")}.`;
  return "Choose from the list.";
}

/** The plain message for one zod issue; exported for the unit test and for code that builds its own issues. */
export function plainMessage(issue: Issue): string {
  switch (issue.code) {
    case "invalid_type":
      if (isMissing(issue.input)) return "Fill in this field.";
      return TYPE_WORDS[issue.expected] ?? "This value is not of the right kind.";
    case "too_big":
      return tooBig(issue);
    case "too_small":
      return tooSmall(issue);
    case "invalid_format":
      if (issue.format === "starts_with")
        return `Must start with “${(issue as { prefix?: string }).prefix ?? ""}”.`;
      if (issue.format === "ends_with")
        return `Must end with “${(issue as { suffix?: string }).suffix ?? ""}”.`;
      if (issue.format === "includes")
        return `Must contain “${(issue as { includes?: string }).includes ?? ""}”.`;
      return FORMAT_WORDS[issue.format] ?? "Check the format of this value.";
    case "not_multiple_of":
      return `Use a multiple of ${amount(issue.divisor)}.`;
    case "unrecognized_keys":
      return `Not a field this form or request accepts: ${issue.keys.join(", ")}.`;
    case "invalid_value":
      return invalidValue(issue.values);
    case "invalid_union":
    case "invalid_key":
    case "invalid_element":
      return "This value is not accepted.";
    default:
      return "Check this value.";
  }
}

z.config({ customError: plainMessage });
