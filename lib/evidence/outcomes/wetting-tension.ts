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

/** Wetting tension by test inks (ISO 8296 / ASTM D2578): each sample's lowest reading against the specification's minimum. */
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
        lines: [`Readings ${data.readingsMNm.join(", ")} mN/m`, r.reason, ...r.warnings],
      };
    },
  );
  return plainOutcome(samples, [], missing);
}
