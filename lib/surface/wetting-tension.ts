/** Raised for input the wetting-tension evaluation cannot accept; `field` names the input. */
export class SurfaceInputError extends RangeError {
  name = "SurfaceInputError";
  readonly field: string | undefined;

  constructor(message: string, field?: string) {
    super(message);
    this.field = field;
  }
}

export type WettingTensionResult = {
  /** The lowest reading as measured: the surface wets at least this well everywhere tested. */
  resultMNm: number;
  /** Mean of the readings to the nearest 0.5 mN/m, for information. */
  meanMNm: number;
  /** Highest minus lowest reading, in mN/m. */
  spreadMNm: number;
  pass: boolean;
  reason: string;
  warnings: string[];
};

/** Readings spread by more than this suggest an unevenly cleaned surface. */
export const WETTING_SPREAD_WARNING_MNM = 1;

/** To the nearest 0.5 mN/m [std, ASTM D2578 / ISO 8296], halves rounded up: for the mean, shown for information only. */
export function roundToHalf(value: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new SurfaceInputError(
      `A wetting tension must be a finite number in mN/m (got ${String(value)}).`,
      "value",
    );
  }
  return Math.round(value * 2) / 2;
}

/**
 * Wetting tension by test inks [std, ASTM D2578 / ISO 8296, adapted: both are written for
 * polyethylene and polypropylene film; the trade applies the same inks to cleaned metal parts]:
 * each reading is the test mixture that wets the surface for about 2 s, in mN/m (= dyn/cm).
 * The result is the lowest reading as measured, never rounded up: a 37.8 mN/m spot does not meet
 * a 38 mN/m minimum, so a pass means every tested spot met it.
 */
export function evaluateWettingTension(
  readingsMNm: number[],
  minimumMNm: number,
): WettingTensionResult {
  if (!Array.isArray(readingsMNm) || readingsMNm.length === 0) {
    throw new SurfaceInputError("Enter at least one test-ink reading in mN/m.", "readingsMNm");
  }
  readingsMNm.forEach((r, i) => {
    if (typeof r !== "number" || !Number.isFinite(r) || r <= 0) {
      throw new SurfaceInputError(
        `Reading ${i + 1} must be a positive number in mN/m (got ${String(r)}).`,
        "readingsMNm",
      );
    }
  });
  if (typeof minimumMNm !== "number" || !Number.isFinite(minimumMNm) || minimumMNm <= 0) {
    throw new SurfaceInputError(
      `The minimum must be a positive number in mN/m (got ${String(minimumMNm)}).`,
      "minimumMNm",
    );
  }

  const lowest = Math.min(...readingsMNm);
  const highest = Math.max(...readingsMNm);
  const mean = readingsMNm.reduce((a, b) => a + b, 0) / readingsMNm.length;
  const resultMNm = lowest;
  const spreadMNm = highest - lowest;
  const pass = resultMNm >= minimumMNm;
  const warnings: string[] = [];
  if (spreadMNm > WETTING_SPREAD_WARNING_MNM) {
    warnings.push(
      `Readings spread by ${spreadMNm.toFixed(1)} mN/m (${lowest}–${highest} mN/m), more than ${WETTING_SPREAD_WARNING_MNM} mN/m: the surface may be unevenly cleaned; check the spots and the inks.`,
    );
  }
  return {
    resultMNm,
    meanMNm: roundToHalf(mean),
    spreadMNm,
    pass,
    reason: `${resultMNm.toFixed(1)} mN/m (lowest of ${readingsMNm.length}, as measured) against a minimum of ${minimumMNm} mN/m: ${pass ? "pass" : "fail"}`,
    warnings,
  };
}
