import { CleanlinessInputError } from "./errors";

export type Iso4406Scale = { readonly code: number; readonly upperPerMl: number };

/**
 * ISO 4406 scale numbers: code N covers more than the previous upper bound up to and including
 * its own, in particles per mL (nominally 0.01 × 2^N, with the published rounded bounds).
 * Sources: 13–20 [std, ISO 4406:2021 table as quoted]; 0–12 and 21–28 [std, ISO 4406:1999 table
 * as reprinted in filter manufacturers' handbooks].
 */
export const ISO4406_SCALE: readonly Iso4406Scale[] = Object.freeze(
  [
    0.01, 0.02, 0.04, 0.08, 0.16, 0.32, 0.64, 1.3, 2.5, 5, 10, 20, 40, 80, 160, 320, 640, 1_300,
    2_500, 5_000, 10_000, 20_000, 40_000, 80_000, 160_000, 320_000, 640_000, 1_300_000, 2_500_000,
  ].map((upperPerMl, code) => Object.freeze({ code, upperPerMl })),
);

/** Scale number of one count per mL: "0" … "28", or ">28" above the table. A count of 0 reads as 0. */
export function iso4406ScaleNumber(perMl: number): string {
  if (typeof perMl !== "number" || !Number.isFinite(perMl) || perMl < 0) {
    throw new CleanlinessInputError(
      `Particles per mL must be a non-negative finite number (got ${String(perMl)}).`,
      "perMl",
    );
  }
  for (const { code, upperPerMl } of ISO4406_SCALE) {
    if (perMl <= upperPerMl) return String(code);
  }
  return ">28";
}

/**
 * ISO 4406 code R4/R6/R14 [std, ISO 4406:2021] from cumulative counts per mL of particles
 * ≥ 4, ≥ 6 and ≥ 14 µm(c), e.g. 3000 / 500 / 7 → "19/16/10".
 */
export function iso4406Code(perMl: [number, number, number]): string {
  if (!Array.isArray(perMl) || perMl.length !== 3) {
    throw new CleanlinessInputError(
      "Give three counts per mL: particles ≥ 4, ≥ 6 and ≥ 14 µm(c).",
      "perMl",
    );
  }
  const codes = perMl.map(iso4406ScaleNumber);
  const [r4, r6, r14] = perMl;
  if (r6 > r4 || r14 > r6) {
    throw new CleanlinessInputError(
      "The counts are cumulative (≥ 4 µm includes ≥ 6 µm, which includes ≥ 14 µm), so they cannot rise with size.",
      "perMl",
    );
  }
  return codes.join("/");
}

/** Below this many particles counted in a channel its scale number is statistically weak. */
export const ISO4406_MIN_COUNTED = 20;

/**
 * The ISO 4406 code with each channel in which fewer than 20 particles were actually counted
 * marked "≥" [memory, ISO 4406:1999 and 2021: a scale number from a raw count below 20 is
 * labelled with ≥, since the true level may be higher], e.g. 14/12/≥7. `counted` holds the raw
 * particles counted per channel (per mL × the volume analysed), not the counts per mL.
 */
export function iso4406CodeMarked(
  perMl: [number, number, number],
  counted: [number, number, number],
): { code: string; weakChannels: ("R4" | "R6" | "R14")[] } {
  const plain = iso4406Code(perMl).split("/");
  if (!Array.isArray(counted) || counted.length !== 3 || counted.some((c) => !(c >= 0)))
    throw new CleanlinessInputError(
      "Give the particles counted in each of the three channels (≥ 4, ≥ 6, ≥ 14 µm(c)).",
      "counted",
    );
  const names = ["R4", "R6", "R14"] as const;
  const weakChannels = names.filter((_, i) => counted[i] < ISO4406_MIN_COUNTED);
  const code = plain.map((n, i) => (counted[i] < ISO4406_MIN_COUNTED ? `≥${n}` : n)).join("/");
  return { code, weakChannels };
}
