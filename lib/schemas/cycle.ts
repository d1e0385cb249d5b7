import { z } from "zod";
import "./messages";
import { apiRegistry } from "./api";
import { storedText } from "./text";

/**
 * A washer's clock as its log prints it: "2026-03-04 06:15", "2026-03-04T06:15:30" or with a zone
 * ("…Z", "…+01:00"). Without a zone the time is UTC, as every stored time is.
 */
const TIME =
  /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:\.\d{1,3})?)?(Z|[+-]\d{2}:?\d{2})?$/;

export function cycleTimeToIso(text: string): string | null {
  const m = TIME.exec(text.trim());
  if (!m) return null;
  const [, y, mo, d, h, mi, s = "00", zone] = m;
  if (Number(h) > 23 || Number(mi) > 59 || Number(s) > 59) return null;
  const stamp = `${y}-${mo}-${d}T${h}:${mi}:${s}${zone ? zone.replace(/^([+-]\d{2})(\d{2})$/, "$1:$2") : "Z"}`;
  const t = Date.parse(stamp);
  if (Number.isNaN(t)) return null;
  // Date.parse rolls 31 April over to 1 May: refuse a day the month does not have.
  const check = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d)));
  if (check.getUTCMonth() !== Number(mo) - 1 || check.getUTCDate() !== Number(d)) return null;
  return new Date(t).toISOString();
}

const cycleTime = (what: string) =>
  z
    .string({ error: `Enter the ${what} time.` })
    .trim()
    .min(1, `Enter the ${what} time.`)
    .transform((text, ctx) => {
      const iso = cycleTimeToIso(text);
      if (iso === null) {
        ctx.addIssue({
          code: "custom",
          message: `Enter the ${what} time as YYYY-MM-DD HH:MM (UTC unless a zone is given).`,
        });
        return z.NEVER;
      }
      return iso;
    });

const code = (what: string) =>
  storedText({ error: `Enter the ${what}.` })
    .trim()
    .min(1, `Enter the ${what}.`)
    .max(60);

/** A lot number as printed on the traveller: letters, digits and - _ . / only, so a list splits cleanly. */
export const lotNumberSchema = storedText()
  .trim()
  .min(1)
  .max(60)
  .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, "A lot number holds letters, digits and - _ . / only.");

/** A lot from a URL segment: decoded once if it still carries escapes, never throwing on a stray "%". */
export function lotFromPath(segment: string) {
  let text = segment;
  try {
    text = decodeURIComponent(segment);
  } catch {
    // a lone "%" is not an escape: the schema refuses it below
  }
  return lotNumberSchema.safeParse(text);
}

/** Lots written in one field or cell: separated by spaces, commas, semicolons or bars. */
export const splitLots = (text: string) =>
  text
    .split(/[\s,;|]+/)
    .map((l) => l.trim())
    .filter((l) => l !== "");

/** Parameter key → actual value, in the recipe parameter's unit. */
const actualValues = z
  .record(
    z.string().trim().min(1).max(80),
    z.number({ error: "Enter a number." }).finite("Enter a number."),
  )
  .refine((v) => Object.keys(v).length <= 40, "At most 40 values per cycle.");

/**
 * One wash cycle, as the form, the CSV import and the API give it: by the codes people read (washer,
 * recipe, part family). The version is the one in force at the start when left out; when given it is
 * checked against that.
 */
export const cycleInputSchema = z
  .object({
    cycleNumber: code("cycle id"),
    system: code("washer (cleaning system code)"),
    recipe: code("recipe code"),
    version: z.number().int().min(1).optional(),
    partFamily: code("part family code"),
    lots: z.array(lotNumberSchema).min(1, "Enter at least one lot number.").max(50),
    baskets: z.number({ error: "Enter the number of baskets." }).int().min(1).max(1000),
    startedAt: cycleTime("start"),
    endedAt: cycleTime("end"),
    operator: storedText({ error: "Enter the operator." })
      .trim()
      .min(1, "Enter the operator.")
      .max(100),
    values: actualValues.default({}),
  })
  .strict()
  .superRefine((c, ctx) => {
    if (Date.parse(c.endedAt) < Date.parse(c.startedAt))
      ctx.addIssue({ code: "custom", path: ["endedAt"], message: "The end is before the start." });
    if (new Set(c.lots).size !== c.lots.length)
      ctx.addIssue({ code: "custom", path: ["lots"], message: "A lot is named twice." });
  });
export type CycleInput = z.output<typeof cycleInputSchema>;
export type CycleInputRaw = z.input<typeof cycleInputSchema>;

/** Nested form names ("values.wash.temperature") back to parameter keys, dropping empty fields. */
function flatten(obj: unknown, prefix = "", out: Record<string, string> = {}) {
  if (obj && typeof obj === "object")
    for (const [k, v] of Object.entries(obj)) flatten(v, prefix ? `${prefix}.${k}` : k, out);
  else if (typeof obj === "string" && obj.trim() !== "") out[prefix] = obj.trim();
  return out;
}

const numberText = (v: unknown) =>
  typeof v === "string" && v.trim() !== "" ? Number(v.trim().replace(",", ".")) : v;

/** The hand-entry form: the same cycle, with lots in one field and numbers typed as text. */
export const cycleFormSchema = z.preprocess((raw) => {
  if (!raw || typeof raw !== "object") return raw;
  const r = raw as Record<string, unknown>;
  const values = Object.fromEntries(
    Object.entries(flatten(r.values)).map(([k, v]) => [k, numberText(v)]),
  );
  return {
    ...r,
    version: r.version === "" || r.version === undefined ? undefined : numberText(r.version),
    baskets: numberText(r.baskets),
    lots: Array.isArray(r.lots)
      ? r.lots.flatMap((l) => (typeof l === "string" ? splitLots(l) : [l]))
      : typeof r.lots === "string"
        ? splitLots(r.lots)
        : r.lots,
    values,
  };
}, cycleInputSchema);

/** GET /api/v1/cycles: by washer, lot or time, newest first. */
export const cyclesQuery = z
  .object({
    limit: z.coerce.number().int().min(1).max(200).default(50).describe("Items per page, 1–200."),
    cursor: z.string().min(1).max(500).optional().describe("nextCursor from the previous page."),
    system: z.string().trim().min(1).max(60).optional().describe("A cleaning system's code."),
    lot: z.string().trim().min(1).max(60).optional().describe("Only cycles that washed this lot."),
    flagged: z.enum(["true", "false"]).optional().describe("true for flagged cycles only."),
  })
  .strict();

/** A batch from a machine feed: one cycle, or up to 1,000 at once; all are saved or none. */
export const cycleBatchSchema = z.union([
  cycleInputSchema,
  z.object({ cycles: z.array(cycleInputSchema).min(1).max(1000) }).strict(),
]);

// ── /api/v1 answers ───────────────────────────────────────────────────────

export const cycleOut = z.object({
  id: z.string(),
  cycleNumber: z.string().describe("The washer's own cycle id; unique per washer."),
  system: z.string().describe("Cleaning system code."),
  recipe: z.string(),
  version: z.number().int().describe("The recipe version in force at the cycle's start."),
  partFamily: z.string(),
  lots: z.array(z.string()),
  baskets: z.number().int(),
  startedAt: z.string().describe("ISO-8601 UTC."),
  endedAt: z.string(),
  operator: z.string(),
  values: z.record(z.string(), z.number()).describe("Actual values by recipe parameter key."),
  flagged: z
    .boolean()
    .describe("A value was outside its validated range, or a critical one missing."),
  flagReasons: z.array(z.string()),
  source: z.enum(["form", "csv", "api"]),
});
apiRegistry.add(cycleOut, { id: "WashCycle" });
export const cyclePage = z.object({
  data: z.array(cycleOut),
  nextCursor: z
    .string()
    .nullable()
    .describe("Pass as cursor for the next page; null on the last page."),
});
apiRegistry.add(cyclePage, { id: "WashCyclePage" });
export const cyclesRecordedOut = z.object({
  batchId: z.string().describe("The recording's id, as its audit event names it."),
  recorded: z.number().int(),
  cycles: z.array(
    z.object({
      id: z.string(),
      cycleNumber: z.string(),
      flagged: z.boolean(),
      reasons: z.array(z.string()),
    }),
  ),
});
apiRegistry.add(cyclesRecordedOut, { id: "WashCyclesRecorded" });
