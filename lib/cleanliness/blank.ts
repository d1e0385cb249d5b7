import { CleanlinessInputError } from "./errors";
import { formatCount, formatPercent } from "./format";
import { withinBound } from "./levels";
import {
  readCounts,
  SIZE_CLASSES,
  SIZE_CLASS_KEYS,
  type ParticleCounts,
  type SizeClassKey,
} from "./size-classes";
import { parseCleanlinessSpec, type CleanlinessSpec } from "./spec";
import { requireFinite, requireOpenFraction, requirePositive } from "./validate";

export type BlankOptions = {
  /** Largest blank value as a fraction of the specified limit; 0.1 (10 %) by default. */
  maxFraction?: number;
  /** The largest particle the specification allows, in µm, when it states one. */
  largestAllowedUm?: number;
  /** The largest particle found in the blank analysis, in µm. */
  largestBlankParticleUm?: number;
};

export type BlankRow = {
  classes: SizeClassKey[];
  blank: number;
  limit: number;
  /** maxFraction × limit. */
  allowed: number;
  pass: boolean;
  reason: string;
};

export type BlankEvaluation = {
  pass: boolean;
  rows: BlankRow[];
  /** The check of the largest blank particle, when a largest allowed size is known. */
  largestParticle: { pass: boolean; reason: string } | null;
};

export const DEFAULT_BLANK_MAX_FRACTION = 0.1; // [std] VDA 19.1:2015 blank value ≤ 10 %

/**
 * Blank value [std, VDA 19.1:2015]: per size class the blank must be at most 10 % of the
 * specified (or expected) limit, and no blank particle may be larger than the largest allowed
 * size. The blank qualifies the measurement; it is never subtracted from the result.
 *
 * `specLimits` is either limits per class (in the same units as the blank counts) or a CCC
 * specification, whose limits are the level upper bounds (A, V) or counts (N); the blank counts
 * must then be normalised like the component result. A class limited to zero allows no blank
 * particle at all.
 */
export function evaluateBlank(
  blankCounts: ParticleCounts,
  specLimits: ParticleCounts | CleanlinessSpec | string,
  opts?: BlankOptions,
): BlankEvaluation {
  const maxFraction = requireOpenFraction(
    opts?.maxFraction ?? DEFAULT_BLANK_MAX_FRACTION,
    "The blank fraction",
    "maxFraction",
  );
  const blank = new Float64Array(SIZE_CLASS_KEYS.length);
  readCounts(blankCounts, blank, "Blank count");
  const groups = limitGroups(specLimits);
  if (groups.length === 0) {
    throw new CleanlinessInputError(
      "Give at least one specified limit to judge the blank.",
      "specLimits",
    );
  }

  const rows: BlankRow[] = groups.map(({ classes, indices, limit }) => {
    let value = 0;
    for (const index of indices) value += blank[index];
    const allowed = maxFraction * limit;
    const pass = withinBound(value, allowed);
    const label = classes.length > 1 ? `${classes[0]}-${classes[classes.length - 1]}` : classes[0];
    return {
      classes,
      blank: value,
      limit,
      allowed,
      pass,
      reason: `${label}: blank ${formatCount(value)}, allowed ${formatPercent(maxFraction)} of ${formatCount(limit)} = ${formatCount(allowed)}: ${pass ? "pass" : "fail"}`,
    };
  });

  let largestParticle: BlankEvaluation["largestParticle"] = null;
  if (opts?.largestAllowedUm !== undefined) {
    const allowedUm = requirePositive(
      opts.largestAllowedUm,
      "Largest allowed particle (µm)",
      "largestAllowedUm",
    );
    const problems: string[] = [];
    SIZE_CLASSES.forEach((sizeClass, i) => {
      if (sizeClass.minUm >= allowedUm && blank[i] > 0) {
        problems.push(
          `class ${sizeClass.key} (≥ ${sizeClass.minUm} µm) holds ${formatCount(blank[i])}`,
        );
      }
    });
    if (opts.largestBlankParticleUm !== undefined) {
      const largest = requireFinite(
        opts.largestBlankParticleUm,
        "Largest blank particle (µm)",
        "largestBlankParticleUm",
      );
      if (largest < 0) {
        throw new CleanlinessInputError(
          "Largest blank particle (µm) must not be negative.",
          "largestBlankParticleUm",
        );
      }
      if (largest > allowedUm) problems.push(`the largest blank particle is ${largest} µm`);
    }
    largestParticle =
      problems.length === 0
        ? { pass: true, reason: `No blank particle above ${allowedUm} µm: pass` }
        : {
            pass: false,
            reason: `Blank particle above ${allowedUm} µm: ${problems.join("; ")}: fail`,
          };
  }

  const pass = rows.every((r) => r.pass) && (largestParticle?.pass ?? true);
  return { pass, rows, largestParticle };
}

type LimitGroup = { classes: SizeClassKey[]; indices: number[]; limit: number };

function limitGroups(specLimits: ParticleCounts | CleanlinessSpec | string): LimitGroup[] {
  if (typeof specLimits === "string") return specGroups(parseCleanlinessSpec(specLimits));
  if (specLimits !== null && typeof specLimits === "object" && "groups" in specLimits) {
    return specGroups(specLimits as CleanlinessSpec);
  }
  const limits = new Float64Array(SIZE_CLASS_KEYS.length);
  readCounts(specLimits as ParticleCounts, limits, "Specified limit");
  const groups: LimitGroup[] = [];
  for (const key in specLimits as ParticleCounts) {
    if ((specLimits as ParticleCounts)[key as SizeClassKey] === undefined) continue;
    const index = SIZE_CLASS_KEYS.indexOf(key as SizeClassKey);
    groups.push({ classes: [key as SizeClassKey], indices: [index], limit: limits[index] });
  }
  return groups.sort((a, b) => a.indices[0] - b.indices[0]);
}

function specGroups(spec: CleanlinessSpec): LimitGroup[] {
  const groups: LimitGroup[] = [];
  for (const group of spec.groups) {
    const indices = group.classes.map((key) => SIZE_CLASS_KEYS.indexOf(key));
    if (group.joined) {
      groups.push({ classes: [...group.classes], indices, limit: group.limit });
    } else {
      group.classes.forEach((key, i) =>
        groups.push({ classes: [key], indices: [indices[i]], limit: group.limit }),
      );
    }
  }
  return groups;
}
