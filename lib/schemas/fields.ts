import { z } from "zod";
import { storedText } from "./text";

/** Field helpers for forms and CSV rows alike: both arrive as text, so empty means "not given". */
export const blank = (v: unknown) =>
  v === undefined || v === null || (typeof v === "string" && v.trim() === "");
const toNumber = (v: unknown) =>
  blank(v) ? null : typeof v === "string" ? Number(v.trim().replace(",", ".")) : v;

type NumberRule = { min?: number; above?: number; max?: number; int?: boolean };
function numberWith(label: string, unit: string, rule: NumberRule) {
  const u = unit ? ` ${unit}` : "";
  let n = z
    .number({
      error: (issue) =>
        issue.input === undefined ? `Enter ${label.toLowerCase()}.` : `${label} must be a number.`,
    })
    .finite(`${label} must be a number.`);
  if (rule.int) n = n.int(`${label} must be a whole number.`);
  if (rule.above !== undefined)
    n = n.gt(rule.above, `${label} must be greater than ${rule.above}${u}.`);
  if (rule.min !== undefined) n = n.min(rule.min, `${label} must be at least ${rule.min}${u}.`);
  if (rule.max !== undefined) n = n.max(rule.max, `${label} must be at most ${rule.max}${u}.`);
  return n;
}
export const optionalNumber = (label: string, unit: string, rule: NumberRule = {}) =>
  z.preprocess(toNumber, numberWith(label, unit, rule).nullable());
export const requiredNumber = (label: string, unit: string, rule: NumberRule = {}) =>
  z.preprocess((v) => toNumber(v) ?? undefined, numberWith(label, unit, rule));

export const requiredText = (label: string, min: number, max: number) =>
  z.preprocess(
    (v) => (typeof v === "string" ? v.trim() : v),
    storedText({ error: `Enter ${label}.` })
      .min(min, `Enter ${label}.`)
      .max(max, `Use at most ${max} characters.`),
  );
export const optionalText = (max: number) =>
  z.preprocess(
    (v) => (blank(v) ? null : typeof v === "string" ? v.trim() : v),
    storedText().max(max, `Use at most ${max} characters.`).nullable(),
  );

export const checkbox = z.preprocess(
  (v) => v === true || v === "on" || v === "true" || v === "yes" || v === "1",
  z.boolean(),
);

/** A list typed as "VB-210-01, VB-210-02" or one per line; blanks and repeats dropped. */
export const textList = (label: string, maxItems: number, maxLength: number) =>
  z.preprocess(
    (v) => {
      // A form posts the typed text as a one-item list (the schema takes a list): split each item too.
      const items = (Array.isArray(v) ? v.map(String) : blank(v) ? [] : [String(v)]).flatMap((s) =>
        s.split(/[;,\n]+/),
      );
      return [...new Set(items.map((s) => s.trim()).filter((s) => s !== ""))];
    },
    z
      .array(storedText().max(maxLength, `Each ${label} has at most ${maxLength} characters.`))
      .max(maxItems, `At most ${maxItems} ${label}s.`),
  );

export const uuid = (what: string) =>
  z.string({ error: `Choose ${what} from the list.` }).uuid(`Choose ${what} from the list.`);
export const optionalUuid = (what: string) =>
  z.preprocess((v) => (blank(v) ? null : v), uuid(what).nullable());
