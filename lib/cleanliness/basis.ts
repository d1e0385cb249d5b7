import { CleanlinessInputError } from "./errors";
import { requireNonNegative, requirePositive, requirePositiveInteger } from "./validate";

/**
 * What a count is related to [std, ISO 16232 / VDA 19.1]: the wetted (tested) surface, the wetted
 * volume, or the number of components tested.
 */
export type Basis =
  | { kind: "area"; totalAreaCm2: number }
  | { kind: "volume"; totalVolumeCm3: number }
  | { kind: "component"; components: number };

export type BasisKind = Basis["kind"];

/** Letter that opens a CCC for each basis: A per 1000 cm², V per 100 cm³, N per component. */
export const BASIS_PREFIX: Readonly<Record<BasisKind, "A" | "V" | "N">> = Object.freeze({
  area: "A",
  volume: "V",
  component: "N",
});

export const BASIS_UNIT: Readonly<Record<BasisKind, string>> = Object.freeze({
  area: "per 1000 cm²",
  volume: "per 100 cm³",
  component: "per component",
});

/**
 * Checks a basis and returns the factor that turns an absolute count into a normalised one:
 * 1000 / area, 100 / volume, or 1 / components.
 */
export function basisFactor(basis: Basis): number {
  if (basis === null || typeof basis !== "object") {
    throw new CleanlinessInputError("A basis (area, volume or component) is required.", "basis");
  }
  switch (basis.kind) {
    case "area":
      return 1000 / requirePositive(basis.totalAreaCm2, "Total tested area (cm²)", "totalAreaCm2");
    case "volume":
      return (
        100 / requirePositive(basis.totalVolumeCm3, "Total tested volume (cm³)", "totalVolumeCm3")
      );
    case "component":
      return 1 / requirePositiveInteger(basis.components, "Number of components", "components");
    default:
      throw new CleanlinessInputError(
        `Unknown basis "${String((basis as { kind: unknown }).kind)}"; use area, volume or component.`,
        "basis",
      );
  }
}

/**
 * Normalised count [derived from ISO 16232 / VDA 19.1]: n_A = n × 1000 / A (cm²),
 * n_V = n × 100 / V (cm³), N = n / components.
 */
export function normalizeCount(absoluteCount: number, basis: Basis): number {
  requireNonNegative(absoluteCount, "Particle count", "absoluteCount");
  return absoluteCount * basisFactor(basis);
}

/** The absolute count a normalised count stands for (the inverse of `normalizeCount`). */
export function denormalizeCount(normalizedCount: number, basis: Basis): number {
  requireNonNegative(normalizedCount, "Normalised count", "normalizedCount");
  return normalizedCount / basisFactor(basis);
}
