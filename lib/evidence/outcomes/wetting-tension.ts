import { evaluateWettingTension } from "@/lib/surface";
import type { WettingSample } from "@/lib/schemas/evidence";
import {
  parsedSamples,
  plainOutcome,
  type OutcomeInput,
  type RunOutcome,
  type SampleOutcome,
} from "./common";

export type WettingTensionOutcomeInput = Pick<OutcomeInput, "spec" | "samples">;

/**
 * Wetting tension by test inks (ISO 8296 / ASTM D2578, adapted from plastic film to metal parts):
 * each sample's lowest reading, as measured, against the specification's minimum.
 */
export const WETTING_METHOD_NOTE =
  "Test inks per ISO 8296 / ASTM D2578, written for plastic film and adapted here to cleaned parts; the lowest reading counts as measured, never rounded up.";
export function wettingTensionOutcome(input: WettingTensionOutcomeInput): RunOutcome {
  const missing: string[] = [];
  const min = input.spec.minWettingTensionMNm;
  if (min === null) missing.push("The specification sets no minimum wetting tension.");
  const samples = parsedSamples<WettingSample>(input).map(
    ({ label, worstCase, data }): SampleOutcome => {
      if (min === null)
        return {
          sampleLabel: label,
          worstCase,
          outcome: "incomplete",
          lines: [`Readings ${data.readingsMNm.join(", ")} mN/m`],
        };
      const r = evaluateWettingTension(data.readingsMNm, min);
      return {
        sampleLabel: label,
        worstCase,
        outcome: r.pass ? "pass" : "fail",
        lines: [
          `Readings ${data.readingsMNm.join(", ")} mN/m`,
          r.reason,
          ...r.warnings,
          WETTING_METHOD_NOTE,
        ],
      };
    },
  );
  return plainOutcome(samples, [], missing);
}
