import type { z } from "zod";

/**
 * The field names an object schema accepts, looking through refinements and
 * transforms (which cannot be made `.strict()` themselves), so an API can refuse
 * unknown fields while validating with the very schema the form uses.
 */
export function knownKeys(schema: z.ZodType): Set<string> | null {
  const def = (schema as unknown as { _zod: { def: { type: string; shape?: Record<string, unknown>; in?: z.ZodType; innerType?: z.ZodType; schema?: z.ZodType } } })._zod.def;
  if (def.type === "object" && def.shape) return new Set(Object.keys(def.shape));
  if (def.type === "pipe" && def.in) return knownKeys(def.in);
  const inner = def.innerType ?? def.schema;
  return inner ? knownKeys(inner) : null;
}

/** Field errors for every key of the body the schema does not know. */
export function unknownFieldErrors(schema: z.ZodType, body: unknown): Record<string, string[]> | null {
  const keys = knownKeys(schema);
  if (!keys || typeof body !== "object" || body === null || Array.isArray(body)) return null;
  const extra = Object.keys(body).filter((k) => !keys.has(k));
  return extra.length ? Object.fromEntries(extra.map((k) => [k, [`Unknown field "${k}".`]])) : null;
}
