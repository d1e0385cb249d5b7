import { SIZE_CLASSES, sizeClassOf, type SizeClassKey } from "@/lib/cleanliness";

/**
 * The size classes an analysis covers whole: those whose lower bound is at or above the lower size
 * limit, up to N [std, ISO 16232:2018 / VDA 19.1:2015: a class is evaluated only where the
 * analysis sees every particle in it]. A class partly below the limit (limit 30 µm, class D
 * 25–50 µm) was not analysed whole, so it is "not analysed", never a count.
 */
export function analysedClasses(lowerSizeLimitUm: number | null | undefined): SizeClassKey[] {
  if (lowerSizeLimitUm === null || lowerSizeLimitUm === undefined)
    return SIZE_CLASSES.map((c) => c.key);
  return SIZE_CLASSES.filter((c) => c.minUm >= lowerSizeLimitUm).map((c) => c.key);
}

/** Classes holding particles that an analysis with this lower size limit could not have counted whole. */
export function countedBelowLimit(
  counts: Partial<Record<string, number>>,
  lowerSizeLimitUm: number | null | undefined,
): SizeClassKey[] {
  const analysed = new Set(analysedClasses(lowerSizeLimitUm));
  return SIZE_CLASSES.filter((c) => !analysed.has(c.key) && (counts[c.key] ?? 0) > 0).map(
    (c) => c.key,
  );
}

export type LargestCheck = { consistent: true } | { consistent: false; reason: string };

/**
 * A largest particle must agree with the counts it came from: its size class holds at least one
 * particle and no larger class holds any (then a larger particle was found) [practice: the
 * largest particle is measured on the same membrane whose counts are reported].
 */
export function largestAgainstCounts(
  what: string,
  largestUm: number,
  counts: Partial<Record<string, number>>,
): LargestCheck {
  if (largestUm < SIZE_CLASSES[0].minUm) return { consistent: true };
  const cls = sizeClassOf(largestUm);
  const index = SIZE_CLASSES.findIndex((c) => c.key === cls);
  const above = SIZE_CLASSES.slice(index + 1).filter((c) => (counts[c.key] ?? 0) > 0);
  if (above.length > 0)
    return {
      consistent: false,
      reason: `${what} ${largestUm} µm (class ${cls}), but class ${above[above.length - 1].key} holds particles: a larger particle was counted.`,
    };
  if ((counts[cls] ?? 0) === 0)
    return {
      consistent: false,
      reason: `${what} ${largestUm} µm lies in class ${cls}, which holds no counted particle.`,
    };
  return { consistent: true };
}
