import type { ObservationSample } from "@/lib/schemas/evidence";
import {
  parsedSamples,
  plainOutcome,
  type Check,
  type OutcomeInput,
  type RunOutcome,
  type SampleOutcome,
} from "./common";

/** The test types decided by a person's observation, each recorded as acceptable or not, with photos. */
export type ObservationTestType = "visual" | "uv_inspection" | "dryness";

export type ObservationOutcomeInput = Pick<OutcomeInput, "samples" | "photoCount">;

const OBSERVED: Record<ObservationTestType, [good: string, bad: string]> = {
  visual: ["No stains or visible residue", "Stains or visible residue seen"],
  uv_inspection: ["No oil film fluorescing under UV", "Oil film seen under UV"],
  dryness: ["Dry", "Water found"],
};

/**
 * Visual, UV and dryness inspections share one rule: each sample passes when it was recorded as
 * acceptable, and the run needs at least one photo of what was seen before it can be decided.
 */
export function observationOutcome(
  testType: ObservationTestType,
  input: ObservationOutcomeInput,
): RunOutcome {
  const [good, bad] = OBSERVED[testType];
  const samples = parsedSamples<ObservationSample>(input).map(
    ({ label, worstCase, data }): SampleOutcome => ({
      sampleLabel: label,
      worstCase,
      outcome: data.acceptable ? "pass" : "fail",
      lines: [`${data.acceptable ? good : bad}${data.observation ? `: ${data.observation}` : ""}`],
    }),
  );
  const photos: Check = {
    kind: "acceptance",
    title: "Photos",
    pass: input.photoCount > 0 ? true : null,
    lines: [
      input.photoCount > 0
        ? `${input.photoCount} photo(s) attached`
        : "No photo attached yet: attach at least one photo of what was seen.",
    ],
  };
  return plainOutcome(samples, [photos], []);
}
