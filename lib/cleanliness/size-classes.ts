import { CleanlinessInputError } from "./errors";
import { requireFinite } from "./validate";

export type SizeClassKey =
  "B" | "C" | "D" | "E" | "F" | "G" | "H" | "I" | "J" | "K" | "L" | "M" | "N";

export type SizeClass = {
  readonly key: SizeClassKey;
  /** Lower bound of the maximum Feret diameter, inclusive, in µm. */
  readonly minUm: number;
  /** Upper bound, exclusive, in µm; null for the open class N. */
  readonly maxUm: number | null;
};

/** [std] ISO 16232:2018 / VDA 19.1:2015 size classes by maximum Feret diameter. */
export const SIZE_CLASSES: readonly SizeClass[] = Object.freeze([
  { key: "B", minUm: 5, maxUm: 15 },
  { key: "C", minUm: 15, maxUm: 25 },
  { key: "D", minUm: 25, maxUm: 50 },
  { key: "E", minUm: 50, maxUm: 100 },
  { key: "F", minUm: 100, maxUm: 150 },
  { key: "G", minUm: 150, maxUm: 200 },
  { key: "H", minUm: 200, maxUm: 400 },
  { key: "I", minUm: 400, maxUm: 600 },
  { key: "J", minUm: 600, maxUm: 1000 },
  { key: "K", minUm: 1000, maxUm: 1500 },
  { key: "L", minUm: 1500, maxUm: 2000 },
  { key: "M", minUm: 2000, maxUm: 3000 },
  { key: "N", minUm: 3000, maxUm: null },
] as const);

export const SIZE_CLASS_KEYS: readonly SizeClassKey[] = Object.freeze(
  SIZE_CLASSES.map((c) => c.key),
);

// No prototype, so keys such as "toString" are not mistaken for classes.
const INDEX_OF: Readonly<Record<string, number | undefined>> = Object.freeze(
  Object.assign(
    Object.create(null) as Record<string, number>,
    Object.fromEntries(SIZE_CLASS_KEYS.map((key, index) => [key, index])),
  ),
);

export function isSizeClassKey(value: string): value is SizeClassKey {
  return typeof value === "string" && INDEX_OF[value] !== undefined;
}

/** Position of a class in B…N (B = 0), or -1 for anything else. */
export function sizeClassIndex(key: string): number {
  return INDEX_OF[key] ?? -1;
}

/** Size class of a particle by its maximum Feret diameter; lower bounds inclusive. */
export function sizeClassOf(um: number): SizeClassKey {
  requireFinite(um, "Particle size (µm)", "um");
  if (um < SIZE_CLASSES[0].minUm) {
    throw new CleanlinessInputError(
      `A particle of ${um} µm is below the smallest size class (B starts at 5 µm).`,
      "um",
    );
  }
  for (let i = SIZE_CLASSES.length - 1; i >= 0; i--) {
    if (um >= SIZE_CLASSES[i].minUm) return SIZE_CLASSES[i].key;
  }
  // Unreachable: um ≥ 5 always meets class B.
  throw new CleanlinessInputError(`No size class for ${um} µm.`, "um");
}

export type ParticleCounts = Partial<Record<SizeClassKey, number>>;

/**
 * Reads a count record into a dense array in class order, rejecting unknown keys and invalid
 * counts. Returns the index of the smallest class present (or -1 when none is).
 */
export function readCounts(counts: ParticleCounts, into: Float64Array, what = "Count"): number {
  if (counts === null || typeof counts !== "object") {
    throw new CleanlinessInputError(
      "Counts must be an object keyed by size class (B…N).",
      "counts",
    );
  }
  // Named reads of the thirteen classes stay fast when every result has the same shape, which a
  // loop over keys does not; this runs for every result evaluated. Bit i marks class i present.
  const present =
    take(into, 0, counts.B, what) |
    take(into, 1, counts.C, what) |
    take(into, 2, counts.D, what) |
    take(into, 3, counts.E, what) |
    take(into, 4, counts.F, what) |
    take(into, 5, counts.G, what) |
    take(into, 6, counts.H, what) |
    take(into, 7, counts.I, what) |
    take(into, 8, counts.J, what) |
    take(into, 9, counts.K, what) |
    take(into, 10, counts.L, what) |
    take(into, 11, counts.M, what) |
    take(into, 12, counts.N, what);
  let presentCount = 0;
  for (let bits = present; bits !== 0; bits &= bits - 1) presentCount++;
  // More keys than classes read means a key that is not a class (or one set to undefined).
  if (Object.keys(counts).length !== presentCount) {
    for (const key of Object.keys(counts)) {
      if (INDEX_OF[key] === undefined) {
        throw new CleanlinessInputError(`"${key}" is not a size class; use B…N.`, "counts");
      }
    }
  }
  return present === 0 ? -1 : 31 - Math.clz32(present & -present);
}

function take(into: Float64Array, index: number, value: number | undefined, what: string): number {
  if (value === undefined) {
    into[index] = 0;
    return 0;
  }
  if (typeof value !== "number" || !Number.isFinite(value) || value < 0) {
    const key = SIZE_CLASS_KEYS[index];
    throw new CleanlinessInputError(
      `${what} for class ${key} must be a non-negative finite number (got ${String(value)}).`,
      key,
    );
  }
  into[index] = value;
  return 1 << index;
}
