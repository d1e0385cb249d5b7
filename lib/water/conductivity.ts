/** Raised for input the conductivity computations cannot accept; `field` names the input. */
export class WaterInputError extends RangeError {
  name = "WaterInputError";
  readonly field: string | undefined;

  constructor(message: string, field?: string) {
    super(message);
    this.field = field;
  }
}

const REFERENCE_C = 25;

function requireConductivity(value: number): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value < 0) {
    throw new WaterInputError(
      `Measured conductivity must be a non-negative finite number in µS/cm (got ${String(value)}).`,
      "measuredUsPerCm",
    );
  }
  return value;
}

function requireTemperature(value: number): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new WaterInputError(
      `Temperature must be a finite number in °C (got ${String(value)}).`,
      "temperatureC",
    );
  }
  if (value < 0 || value > 100) {
    throw new WaterInputError(
      `Temperature must be between 0 and 100 °C for liquid water (got ${value}).`,
      "temperatureC",
    );
  }
  return value;
}

/**
 * Linear temperature compensation to 25 °C [practice: what conductivity meters apply by default;
 * no standard fixes α]: κ25 = κT / (1 + α (T − 25)), α ≈ 0.02 per °C for most natural and rinse
 * waters. It does not hold for pure water (see PURE_WATER_BELOW_US_PER_CM).
 */
export function conductivityAt25C(
  measuredUsPerCm: number,
  temperatureC: number,
  alphaPerDegC = 0.02,
): number {
  requireConductivity(measuredUsPerCm);
  requireTemperature(temperatureC);
  if (
    typeof alphaPerDegC !== "number" ||
    !Number.isFinite(alphaPerDegC) ||
    alphaPerDegC < 0 ||
    alphaPerDegC > 0.1
  ) {
    throw new WaterInputError(
      `The temperature coefficient must be between 0 and 0.1 per °C (got ${String(alphaPerDegC)}).`,
      "alphaPerDegC",
    );
  }
  const denominator = 1 + alphaPerDegC * (temperatureC - REFERENCE_C);
  if (denominator <= 0) {
    throw new WaterInputError(
      `With α = ${alphaPerDegC} per °C the compensation is undefined at ${temperatureC} °C.`,
      "alphaPerDegC",
    );
  }
  return measuredUsPerCm / denominator;
}

export type F25Point = {
  readonly temperatureC: number;
  readonly f25: number;
  readonly source: string;
};

/**
 * ISO 7888 (EN 27888) factors f25(T) for natural water, κ25 = f25(T) · κT, at whole degrees
 * 0–35 °C [std, ISO 7888 table as reprinted in a conductivity meter's manual; 20 °C and 30 °C
 * also as quoted in standards.md]. Between whole degrees we interpolate linearly (the
 * table's own tenth-degree columns differ from that by at most 0.001); outside 0–35 °C the
 * standard gives no factor, so we refuse rather than extrapolate.
 */
const F25_WHOLE_DEGREES = [
  1.918, 1.857, 1.8, 1.745, 1.693, 1.643, 1.596, 1.551, 1.508, 1.467, 1.428, 1.39, 1.354, 1.32,
  1.287, 1.256, 1.225, 1.196, 1.168, 1.141, 1.116, 1.091, 1.067, 1.044, 1.021, 1.0, 0.979, 0.959,
  0.94, 0.921, 0.903, 0.886, 0.869, 0.853, 0.837, 0.822,
] as const;

export const ISO7888_F25: readonly F25Point[] = Object.freeze(
  F25_WHOLE_DEGREES.map((f25, temperatureC) => ({
    temperatureC,
    f25,
    source:
      temperatureC === 25
        ? "[std] reference temperature: f25(25 °C) = 1"
        : "[std] ISO 7888 table of f25(T) for natural water",
  })),
);

/** f25(T) interpolated linearly between the tabulated temperatures. */
export function f25NaturalWater(temperatureC: number): number {
  requireTemperature(temperatureC);
  const first = ISO7888_F25[0];
  const last = ISO7888_F25[ISO7888_F25.length - 1];
  if (temperatureC < first.temperatureC || temperatureC > last.temperatureC) {
    throw new WaterInputError(
      `The ISO 7888 factor table held here spans ${first.temperatureC}–${last.temperatureC} °C; ${temperatureC} °C is outside it. Measure within that span or use linear compensation.`,
      "temperatureC",
    );
  }
  for (let i = 1; i < ISO7888_F25.length; i++) {
    const high = ISO7888_F25[i];
    if (temperatureC <= high.temperatureC) {
      const low = ISO7888_F25[i - 1];
      const t = (temperatureC - low.temperatureC) / (high.temperatureC - low.temperatureC);
      return low.f25 + t * (high.f25 - low.f25);
    }
  }
  return last.f25;
}

/** Non-linear compensation for natural water [std, ISO 7888]: κ25 = f25(T) · κT. */
export function conductivityAt25CNonLinear(measuredUsPerCm: number, temperatureC: number): number {
  requireConductivity(measuredUsPerCm);
  return f25NaturalWater(temperatureC) * measuredUsPerCm;
}

/**
 * Below about 1 µS/cm (ISO 3696 grade 2 water is ≤ 1.0 µS/cm [std]) the conductivity of water
 * itself dominates and changes with temperature far from linearly, so meters switch to a
 * pure-water (non-linear) compensation [practice]. The 2 %/°C result there is only indicative.
 */
export const PURE_WATER_BELOW_US_PER_CM = 1;

/** The warning a compensated reading needs, or null. */
export function pureWaterWarning(compensatedUsPerCm: number): string | null {
  return compensatedUsPerCm < PURE_WATER_BELOW_US_PER_CM
    ? `Below about ${PURE_WATER_BELOW_US_PER_CM} µS/cm the linear 2 %/°C compensation does not hold: pure-water compensation applies. Read the value from a meter set for pure water.`
    : null;
}
