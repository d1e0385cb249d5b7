import { GRAVIMETRY_PRACTICAL_LIMIT_MG, gravimetricResidue } from "@/lib/cleanliness";
import type { GravimetricSample } from "@/lib/schemas/evidence";
import {
  fmt,
  parsedSamples,
  plainOutcome,
  word,
  type OutcomeInput,
  type RunOutcome,
  type SampleOutcome,
} from "./common";

export type GravimetricOutcomeInput = Pick<OutcomeInput, "family" | "spec" | "samples">;

/**
 * Gravimetric residue (ISO 16232 / VDA 19.1): each sample's residue per component or per 1000 cm²
 * against the specification's limit; a blank above 10 % of the residue, or a residue below the
 * practical lower limit, leaves the sample unqualified. The blank is never subtracted.
 */
export function gravimetricOutcome(input: GravimetricOutcomeInput): RunOutcome {
  const missing: string[] = [];
  const limit = input.spec.gravimetricLimitMg;
  if (limit === null) missing.push("The specification sets no gravimetric limit.");
  const perArea = input.spec.gravimetricBasis === "per_1000_cm2";
  const samples = parsedSamples<GravimetricSample>(input).map(
    ({ label, worstCase, data }): SampleOutcome => {
      const r = gravimetricResidue({
        filterBeforeMg: data.filterBeforeMg,
        filterAfterMg: data.filterAfterMg,
        blankMg: data.blankMg,
        components: data.components,
        totalAreaCm2: data.components * input.family.wettedAreaCm2,
      });
      const value = perArea ? r.per1000Cm2Mg! : r.perComponentMg;
      const unit = perArea ? "mg per 1000 cm²" : "mg per component";
      const lines = [
        `Residue ${fmt(data.filterAfterMg, 2)} − ${fmt(data.filterBeforeMg, 2)} = ${fmt(r.residueMg, 2)} mg over ${data.components} component(s) → ${fmt(value, 3)} ${unit}`,
        ...r.notes,
      ];
      // Below the practical lower limit the balance cannot tell the residue from zero: no verdict, pool more parts.
      if (r.belowPracticalLimit)
        return {
          sampleLabel: label,
          worstCase,
          outcome: "incomplete",
          lines: [
            ...lines,
            `Not qualified: the residue is below the method's practical lower limit of ${fmt(GRAVIMETRY_PRACTICAL_LIMIT_MG, 0)} mg. Pool more parts on one filter; this is not a pass.`,
          ],
        };
      if (r.blankOk === false)
        return {
          sampleLabel: label,
          worstCase,
          outcome: "incomplete",
          lines: [...lines, "Blank above 10 % of the residue: the measurement is not qualified"],
        };
      if (limit === null) return { sampleLabel: label, worstCase, outcome: "incomplete", lines };
      const ok = value <= limit;
      lines.push(`Limit ${fmt(limit, 3)} ${unit}: ${word(ok)}`);
      return { sampleLabel: label, worstCase, outcome: ok ? "pass" : "fail", lines };
    },
  );
  return plainOutcome(samples, [], missing);
}
