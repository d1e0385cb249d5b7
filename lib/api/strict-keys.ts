import type { z } from "zod";

type Def = {
  type: string;
  shape?: Record<string, z.ZodType>;
  catchall?: z.ZodType;
  in?: z.ZodType;
  innerType?: z.ZodType;
  schema?: z.ZodType;
  element?: z.ZodType;
  valueType?: z.ZodType;
  options?: z.ZodType[];
  left?: z.ZodType;
  right?: z.ZodType;
};
const defOf = (schema: z.ZodType | undefined): Def | undefined =>
  (schema as unknown as { _zod?: { def: Def } } | undefined)?._zod?.def;

/**
 * The field names an object schema accepts, looking through refinements and
 * transforms (which cannot be made `.strict()` themselves), so an API can refuse
 * unknown fields while validating with the very schema the form uses.
 */
export function knownKeys(schema: z.ZodType): Set<string> | null {
  const def = defOf(schema);
  if (!def) return null;
  if (def.type === "object" && def.shape) return new Set(Object.keys(def.shape));
  if (def.type === "pipe" && def.in) return knownKeys(def.in);
  if (def.type === "union" && def.options) {
    // Any option's fields (a method's kind picks which): the full check is the option's own.
    const sets = def.options.map(knownKeys);
    return sets.every(Boolean) ? new Set(sets.flatMap((k) => [...k!])) : null;
  }
  const inner = def.innerType ?? def.schema;
  return inner ? knownKeys(inner) : null;
}

const isPlainObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === "object" && v !== null && !Array.isArray(v);

function message(key: string, known: Iterable<string>): string {
  // A mis-cased key ("b" for class "B") is the likeliest slip of an integrator: say which one was meant.
  const meant = [...known].find((k) => k !== key && k.toLowerCase() === key.toLowerCase());
  return meant
    ? `Unknown field "${key}": did you mean "${meant}"? Field names are case-sensitive.`
    : `Unknown field "${key}".`;
}

function walk(
  schema: z.ZodType | undefined,
  value: unknown,
  path: string[],
  out: Record<string, string[]>,
  depth: number,
): void {
  const def = defOf(schema);
  if (!def || depth > 32 || value === undefined || value === null) return;
  switch (def.type) {
    case "object": {
      if (!isPlainObject(value)) return;
      const shape = def.shape ?? {};
      // An object with a catch-all (other than `never`, which .strict() sets) takes any key by design.
      const open = def.catchall && defOf(def.catchall)?.type !== "never";
      for (const [key, child] of Object.entries(value)) {
        if (Object.hasOwn(shape, key)) walk(shape[key], child, [...path, key], out, depth + 1);
        else if (!open) out[[...path, key].join(".")] = [message(key, Object.keys(shape))];
      }
      return;
    }
    case "pipe":
      return walk(def.in, value, path, out, depth + 1);
    case "array":
      if (Array.isArray(value))
        value.forEach((item, i) => walk(def.element, item, [...path, String(i)], out, depth + 1));
      return;
    case "record":
      if (isPlainObject(value))
        for (const [key, child] of Object.entries(value))
          walk(def.valueType, child, [...path, key], out, depth + 1);
      return;
    case "union": {
      // The option that fits best decides: no complaint if any option takes every key.
      let best: Record<string, string[]> | null = null;
      for (const option of def.options ?? []) {
        const found: Record<string, string[]> = {};
        walk(option, value, path, found, depth + 1);
        if (!best || Object.keys(found).length < Object.keys(best).length) best = found;
        if (Object.keys(found).length === 0) return;
      }
      Object.assign(out, best ?? {});
      return;
    }
    case "intersection": {
      // Each side knows part of the keys: a key is unknown only if neither side takes it.
      const left: Record<string, string[]> = {};
      const right: Record<string, string[]> = {};
      walk(def.left, value, path, left, depth + 1);
      walk(def.right, value, path, right, depth + 1);
      for (const key of Object.keys(left)) if (key in right) out[key] = left[key];
      return;
    }
    default: {
      const inner = def.innerType ?? def.schema;
      if (inner) walk(inner, value, path, out, depth + 1);
    }
  }
}

/**
 * Field errors for every key of the body, at any depth, that its schema does not know — named by
 * its dotted path ("counts.b"). zod's plain objects drop such keys silently, so a lab result posted
 * with a lower-case class would store no counts and look clean; this refuses it instead.
 */
export function unknownFieldErrors(
  schema: z.ZodType,
  body: unknown,
): Record<string, string[]> | null {
  const out: Record<string, string[]> = {};
  walk(schema, body, [], out, 0);
  return Object.keys(out).length ? out : null;
}

/** The headline for a body refused for unknown keys, naming the first few. */
export function unknownFieldsMessage(errors: Record<string, string[]>): string {
  const keys = Object.keys(errors);
  const named = keys
    .slice(0, 5)
    .map((k) => `"${k}"`)
    .join(", ");
  return `${keys.length === 1 ? "This field is" : "These fields are"} not known here: ${named}${keys.length > 5 ? ` and ${keys.length - 5} more` : ""}. Nothing was saved.`;
}

/**
 * Every key of a submitted form that its action does not read, refused by name rather than
 * dropped: a lower-case class under "counts" or a mis-typed field would otherwise vanish and the
 * record would look complete. A form's action reads its input schema and, for some forms, a
 * second schema chosen once the record is known (a run's test type picks its sample schema) or
 * a field the page sends only to say what to refresh: those are the `alsoReads` schemas, whose
 * top-level keys pass here and are checked in full when that schema is parsed.
 */
export function unknownFormFields(
  schema: z.ZodType,
  form: unknown,
  alsoReads: readonly z.ZodType[] = [],
): Record<string, string[]> | null {
  const all = unknownFieldErrors(schema, form);
  if (!all) return null;
  const readLater = new Set(alsoReads.flatMap((other) => [...(knownKeys(other) ?? [])]));
  const kept = Object.entries(all).filter(([path]) => path.includes(".") || !readLater.has(path));
  return kept.length ? Object.fromEntries(kept) : null;
}
