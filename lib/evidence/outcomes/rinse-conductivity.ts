import { conductivityAt25C } from "@/lib/water";
import { pureWaterWarning } from "@/lib/water/conductivity";
import type { ConductivitySample } from "@/lib/schemas/evidence";
import {
  fmt,
  parsedSamples,
  plainOutcome,
  word,
  type OutcomeInput,
  type RunOutcome,
  type SampleOutcome,
} from "./common";

export type RinseConductivityOutcomeInput = Pick<
  OutcomeInput,
  "conductivityLimitUsPerCm" | "samples"
>;

/**
 * Final-rinse conductivity: each reading compensated to 25 °C (linear, α = 2 %/°C, the meters'
 * default — instrument practice, not a standard) against the recipe version's limit.
 */
export function rinseConductivityOutcome(input: RinseConductivityOutcomeInput): RunOutcome {
  const missing: string[] = [];
  const limit = input.conductivityLimitUsPerCm;
  if (limit === null) missing.push("The recipe version sets no rinse-water conductivity limit.");
  const samples = parsedSamples<ConductivitySample>(input).map(
    ({ label, worstCase, data }): SampleOutcome => {
      const k25 = conductivityAt25C(data.measuredUsPerCm, data.temperatureC);
      const lines = [
        `${fmt(data.measuredUsPerCm)} µS/cm at ${fmt(data.temperatureC)} °C → ${fmt(k25)} µS/cm at 25 °C (linear, α = 2 %/°C, instrument practice)`,
      ];
      const warning = pureWaterWarning(k25);
      if (warning) lines.push(warning);
      if (limit === null) return { sampleLabel: label, worstCase, outcome: "incomplete", lines };
      const ok = k25 <= limit;
      lines.push(`Limit ${fmt(limit)} µS/cm at 25 °C: ${word(ok)}`);
      return { sampleLabel: label, worstCase, outcome: ok ? "pass" : "fail", lines };
    },
  );
  return plainOutcome(samples, [], missing);
}
