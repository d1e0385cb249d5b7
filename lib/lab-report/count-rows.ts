import {
  cleanlinessLevel,
  normalizeCount,
  SIZE_CLASSES,
  type Basis,
  type SizeClassKey,
} from "@/lib/cleanliness";
import { analysedClasses } from "./analysed-classes";

export interface CountRow {
  key: SizeClassKey;
  /** "50–100 µm", "≥ 3000 µm". */
  range: string;
  /** False: below the lower size limit, so the class shows "not analysed", never 0. */
  analysed: boolean;
  absolute: number | null;
  normalised: number | null;
  /** The cleanliness level for A and V results; null for N (counts per component) or not analysed. */
  level: string | null;
}

/**
 * The report's table of particle counts per size class, absolute and normalised to the basis
 * [std, ISO 16232:2018 / VDA 19.1:2015: n_A = n × 1000 / A, n_V = n × 100 / V, N = n / k]. A class
 * the analysis did not cover is "not analysed": printing 0 there would claim a count nobody made.
 */
export function countRows(
  counts: Partial<Record<string, number>>,
  basis: Basis,
  lowerSizeLimitUm: number | null,
): CountRow[] {
  const analysed = new Set(analysedClasses(lowerSizeLimitUm));
  return SIZE_CLASSES.map((c) => {
    const range = c.maxUm === null ? `≥ ${c.minUm} µm` : `${c.minUm}–${c.maxUm} µm`;
    if (!analysed.has(c.key))
      return { key: c.key, range, analysed: false, absolute: null, normalised: null, level: null };
    const absolute = counts[c.key] ?? 0;
    const normalised = normalizeCount(absolute, basis);
    return {
      key: c.key,
      range,
      analysed: true,
      absolute,
      normalised,
      level: basis.kind === "component" ? null : cleanlinessLevel(normalised),
    };
  });
}
