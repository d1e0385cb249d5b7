/**
 * Detergent concentration from a titration: the titrant volume used to reach the end point times
 * the detergent's titration factor, which the supplier states for its product, titrant and sample
 * size (common practice: "mL of 0.1 N HCl × factor = % by volume" on the product data sheet).
 */
export function concentrationFromTitration(input: {
  titrantVolumeMl: number;
  factorPctPerMl: number;
}): number {
  if (!Number.isFinite(input.titrantVolumeMl) || input.titrantVolumeMl < 0)
    throw new RangeError("The titrant volume must be zero or more millilitres.");
  if (!Number.isFinite(input.factorPctPerMl) || input.factorPctPerMl <= 0)
    throw new RangeError("The titration factor must be greater than zero.");
  // Rounded to 0.001 %: a burette reads to 0.05 mL, so more digits would only be noise.
  return Math.round(input.titrantVolumeMl * input.factorPctPerMl * 1000) / 1000;
}
