import { CleanlinessInputError } from "./errors";

export type CleanlinessLevel = {
  readonly level: string;
  readonly upper: number;
  /** Where the bound comes from: "std" read from the standard as quoted, "memory" recalled. */
  readonly source: "std" | "memory";
};

/**
 * Cleanliness levels of ISO 16232:2018: a level covers normalised counts above the previous
 * level's upper bound up to and including its own (per 1000 cm² or per 100 cm³).
 * Sources: 00, 0, 10, 12, 16, 17 and the upper bounds of 4–9 (16/32/64/130/250/500) [std, ISO
 * 16232:2018 level table as quoted]; the others [memory], each equal to 100 × the upper bound of
 * the ISO 4406 scale number of the same number (see iso4406.ts), which agrees at every [std] level
 * (checked in tests/unit/cleanliness.test.ts).
 */
export const CLEANLINESS_LEVELS: readonly CleanlinessLevel[] = Object.freeze([
  { level: "00", upper: 0, source: "std" }, // no particle
  { level: "0", upper: 1, source: "std" },
  { level: "1", upper: 2, source: "memory" },
  { level: "2", upper: 4, source: "memory" },
  { level: "3", upper: 8, source: "memory" },
  { level: "4", upper: 16, source: "std" },
  { level: "5", upper: 32, source: "std" },
  { level: "6", upper: 64, source: "std" },
  { level: "7", upper: 130, source: "std" },
  { level: "8", upper: 250, source: "std" },
  { level: "9", upper: 500, source: "std" },
  { level: "10", upper: 1_000, source: "std" },
  { level: "11", upper: 2_000, source: "memory" },
  { level: "12", upper: 4_000, source: "std" },
  { level: "13", upper: 8_000, source: "memory" },
  { level: "14", upper: 16_000, source: "memory" },
  { level: "15", upper: 32_000, source: "memory" },
  // Quoted with level 17 as "64,000 – 130,000 particles per 1000 cm²" (a cleanliness lab's reading of ISO 16232 / VDA 19.1).
  { level: "16", upper: 64_000, source: "std" },
  { level: "17", upper: 130_000, source: "std" },
  { level: "18", upper: 250_000, source: "memory" },
  { level: "19", upper: 500_000, source: "memory" },
  { level: "20", upper: 1_000_000, source: "memory" },
  { level: "21", upper: 2_000_000, source: "memory" },
  { level: "22", upper: 4_000_000, source: "memory" },
  { level: "23", upper: 8_000_000, source: "memory" },
  { level: "24", upper: 16_000_000, source: "memory" },
] as const);

/** Returned by `cleanlinessLevel` for counts above the last level of the table. */
export const ABOVE_LAST_LEVEL = ">24";

// Normalising (n × 1000 / area) in binary floating point can land a hair above a bound that the
// exact ratio meets, so bounds are compared with a relative tolerance far below any real count.
const RELATIVE_TOLERANCE = 1e-12;

const NAMES = CLEANLINESS_LEVELS.map((l) => l.level);
const UPPERS = Float64Array.from(CLEANLINESS_LEVELS, (l) => l.upper * (1 + RELATIVE_TOLERANCE));
const LAST = UPPERS.length - 1; // index of level 24
const UPPER_BY_NAME: ReadonlyMap<string, number> = new Map(
  CLEANLINESS_LEVELS.map((l) => [l.level, l.upper]),
);

/** Level names by `levelIndex`: "00", "0" … "24", then ">24". */
export const LEVEL_NAMES: readonly string[] = Object.freeze([...NAMES, ABOVE_LAST_LEVEL]);

/** `value ≤ bound`, allowing for floating-point noise in a normalised count. */
export function withinBound(value: number, bound: number): boolean {
  return value <= bound * (1 + RELATIVE_TOLERANCE);
}

/** ISO 16232 cleanliness level of a normalised count: "00", "0", "1" … "24", or ">24". */
export function cleanlinessLevel(n: number): string {
  if (typeof n !== "number" || !Number.isFinite(n) || n < 0) {
    throw new CleanlinessInputError(
      `A normalised count must be a non-negative finite number (got ${String(n)}).`,
      "n",
    );
  }
  return LEVEL_NAMES[levelIndex(n)];
}

/**
 * Position of a checked, non-negative normalised count in `LEVEL_NAMES` (0 for "00", 26 for
 * ">24"), for callers that have already validated their input.
 */
export function levelIndex(n: number): number {
  if (n === 0) return 0;
  // Upper bounds are 2^(i−1) rounded by less than 5 % (130 for 128, 250 for 256 …), so guessing
  // i = ⌈log2 n⌉ + 1 lands on the level or next to it and one comparison each way settles it.
  // The guess is the bit length of ⌈n⌉ − 1 (one instruction) while that fits in 32 bits.
  let i =
    n <= 1 ? 1 : n <= 0x80000000 ? 33 - Math.clz32(Math.ceil(n) - 1) : Math.ceil(Math.log2(n)) + 1;
  if (i > LAST) return LAST + 1;
  if (n > UPPERS[i]) i++;
  else if (i > 1 && n <= UPPERS[i - 1]) i--;
  return i;
}

/** Upper bound (inclusive) of a level's normalised count; throws for unknown levels. */
export function levelUpperBound(level: string): number {
  const upper = UPPER_BY_NAME.get(level);
  if (upper === undefined) {
    throw new CleanlinessInputError(
      `"${level}" is not a cleanliness level; use 00, 0, 1 … 24.`,
      "level",
    );
  }
  return upper;
}

export function isCleanlinessLevel(level: string): boolean {
  return UPPER_BY_NAME.has(level);
}
