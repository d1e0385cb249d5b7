import { BASIS_PREFIX, basisFactor, type Basis } from "./basis";
import { CleanlinessInputError } from "./errors";
import { formatCount } from "./format";
import { LEVEL_NAMES, levelIndex } from "./levels";
import {
  readCounts,
  SIZE_CLASS_KEYS,
  sizeClassIndex,
  type ParticleCounts,
  type SizeClassKey,
} from "./size-classes";

export type CleanlinessCodeOptions = {
  /**
   * The classes analysed, written in this order. By default: from the smallest class present in
   * the counts up to N, since classes above the largest particle found hold no particle (00).
   */
  classes?: readonly SizeClassKey[];
};

const scratch = new Float64Array(SIZE_CLASS_KEYS.length);

/**
 * Component Cleanliness Code [std, ISO 16232:2018 / VDA 19.1:2015]: the prefix A (per 1000 cm²),
 * V (per 100 cm³) or N (per component), then each class with its level, or with the count per
 * component for N, e.g. `A(E7/F6/G00/H4/…)`, `N(E4.67/F2/…)`.
 */
export function cleanlinessCode(
  counts: ParticleCounts,
  basis: Basis,
  opts?: CleanlinessCodeOptions,
): string {
  const factor = basisFactor(basis);
  const smallest = readCounts(counts, scratch);
  const perComponent = basis.kind === "component";
  let classes: readonly number[];

  if (opts?.classes !== undefined) {
    classes = checkedClasses(opts.classes);
  } else {
    classes = FROM[smallest < 0 ? 0 : smallest];
  }
  // One join allocates the code once, rather than one intermediate string per class.
  const parts = new Array<string>(classes.length);
  for (let j = 0; j < classes.length; j++) {
    const i = classes[j];
    const normalised = scratch[i] * factor;
    parts[j] = perComponent
      ? SIZE_CLASS_KEYS[i] + formatCount(normalised)
      : FRAGMENTS[i][levelIndex(normalised)];
  }
  return OPEN[basis.kind] + parts.join("/") + ")";
}

const OPEN: Readonly<Record<Basis["kind"], string>> = {
  area: BASIS_PREFIX.area + "(",
  volume: BASIS_PREFIX.volume + "(",
  component: BASIS_PREFIX.component + "(",
};

// FROM[i] lists the class indices i … N: the default range when class i is the smallest present.
const FROM: readonly (readonly number[])[] = SIZE_CLASS_KEYS.map((_, start) =>
  SIZE_CLASS_KEYS.map((__, i) => i).slice(start),
);

function checkedClasses(keys: readonly SizeClassKey[]): number[] {
  if (keys.length === 0) {
    throw new CleanlinessInputError("At least one size class must be listed.", "classes");
  }
  const indices: number[] = [];
  for (const key of keys) {
    const index = sizeClassIndex(key);
    if (index < 0) throw new CleanlinessInputError(`"${key}" is not a size class.`, "classes");
    if (indices.length > 0 && index <= indices[indices.length - 1]) {
      throw new CleanlinessInputError(
        "List the size classes once each, from B towards N.",
        "classes",
      );
    }
    indices.push(index);
  }
  for (let i = 0; i < SIZE_CLASS_KEYS.length; i++) {
    if (scratch[i] > 0 && !indices.includes(i)) {
      throw new CleanlinessInputError(
        `Class ${SIZE_CLASS_KEYS[i]} has particles but is not among the classes analysed.`,
        SIZE_CLASS_KEYS[i],
      );
    }
  }
  return indices;
}

// "E7"-style fragments for every class and level, built once, so a code is joined from
// ready-made pieces.
const FRAGMENTS: readonly (readonly string[])[] = SIZE_CLASS_KEYS.map((key) =>
  LEVEL_NAMES.map((level) => key + level),
);
