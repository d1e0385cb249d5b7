import type { z } from "zod";
import { formToObject } from "@/lib/schemas/evidence";

type Def = {
  type: string;
  innerType?: z.ZodType;
  in?: z.ZodType;
  out?: z.ZodType;
  shape?: Record<string, z.ZodType>;
};
const defOf = (schema: z.ZodType | undefined): Def | undefined =>
  (schema as unknown as { _zod?: { def: Def } } | undefined)?._zod?.def;

const WRAPPERS = new Set([
  "optional",
  "nullable",
  "default",
  "prefault",
  "catch",
  "readonly",
  "nonoptional",
]);

/** Whether a field's schema, under its optional/default/transform wrappers, takes a list. */
function takesArray(schema: z.ZodType | undefined, depth = 0): boolean {
  const def = defOf(schema);
  if (!def || depth > 8) return false;
  if (def.type === "array") return true;
  if (WRAPPERS.has(def.type)) return takesArray(def.innerType, depth + 1);
  if (def.type === "pipe") return takesArray(def.in, depth + 1) || takesArray(def.out, depth + 1);
  return false;
}

/** The object shape of a form schema, under a transform or refinement. */
function shapeOf(schema: z.ZodType, depth = 0): Record<string, z.ZodType> | undefined {
  const def = defOf(schema);
  if (!def || depth > 8) return undefined;
  if (def.type === "object")
    return (schema as unknown as { shape: Record<string, z.ZodType> }).shape;
  if (WRAPPERS.has(def.type)) return def.innerType && shapeOf(def.innerType, depth + 1);
  if (def.type === "pipe")
    return (def.in && shapeOf(def.in, depth + 1)) ?? (def.out && shapeOf(def.out, depth + 1));
  return undefined;
}

/** The top-level fields of a form schema that take several values (checkbox groups, multi-selects). */
export function arrayFields(schema: z.ZodType): string[] {
  const shape = shapeOf(schema) ?? {};
  return Object.keys(shape).filter((key) => takesArray(shape[key]));
}

/**
 * A submitted form as the plain object its schema reads: dotted names nest ("counts.B"), files and
 * the framework's own fields are left out, and a field the schema takes as a list keeps every value.
 */
export function readForm(formData: FormData, schema?: z.ZodType): Record<string, unknown> {
  const out = formToObject(formData);
  for (const key of schema ? arrayFields(schema) : []) {
    out[key] = formData.getAll(key).filter((v): v is string => typeof v === "string");
  }
  return out;
}
