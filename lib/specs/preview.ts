import { BASIS_UNIT } from "@/lib/cleanliness/basis";
import { CleanlinessSpecError } from "@/lib/cleanliness/errors";
import { formatCount } from "@/lib/cleanliness/format";
import { SIZE_CLASSES, type SizeClassKey } from "@/lib/cleanliness/size-classes";
import { parseCleanlinessSpec } from "@/lib/cleanliness/spec";

export type SpecPreviewRow = {
  /** The group as written, e.g. "B-E17". */
  text: string;
  /** "B–E" for joined classes, "E, F" for letters limited each on their own. */
  classes: string;
  /** The size span the classes cover, e.g. "5–100 µm" or "≥ 3000 µm". */
  sizes: string;
  /** How the limit applies: to the sum of the classes, or to each class. */
  applies: "sum" | "each";
  level: string | null;
  /** The largest count allowed, in the specification's basis. */
  limit: string;
};

export type SpecPreview =
  | { ok: true; text: string; basis: string; rows: SpecPreviewRow[] }
  | { ok: false; message: string; position: number | null };

function sizeSpan(keys: readonly SizeClassKey[]) {
  const first = SIZE_CLASSES.find((c) => c.key === keys[0])!;
  const last = SIZE_CLASSES.find((c) => c.key === keys[keys.length - 1])!;
  return last.maxUm === null ? `≥ ${first.minUm} µm` : `${first.minUm}–${last.maxUm} µm`;
}

/**
 * What a typed cleanliness-code specification means, for the form to show while it is typed:
 * the classes and limits of each group, or the parser's message with the character it stopped at.
 * Notation: ISO 16232:2018 / VDA 19.1:2015 cleanliness code (CCC), as read by lib/cleanliness.
 */
export function previewCleanlinessSpec(text: string): SpecPreview {
  if (text.trim() === "")
    return {
      ok: false,
      message: "Type the specification, e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00).",
      position: null,
    };
  try {
    const spec = parseCleanlinessSpec(text);
    return {
      ok: true,
      text: spec.text,
      basis: BASIS_UNIT[spec.basis],
      rows: spec.groups.map((g) => ({
        text: g.text,
        classes:
          g.joined && g.classes.length > 1
            ? `${g.classes[0]}–${g.classes[g.classes.length - 1]}`
            : g.classes.join(", "),
        sizes: sizeSpan(g.classes),
        applies: g.joined || g.classes.length === 1 ? "sum" : "each",
        level: g.level,
        limit: Number.isFinite(g.limit) ? formatCount(g.limit) : "no limit",
      })),
    };
  } catch (error) {
    if (error instanceof CleanlinessSpecError)
      return { ok: false, message: error.message, position: error.position ?? null };
    return { ok: false, message: "Not a cleanliness-code specification.", position: null };
  }
}
