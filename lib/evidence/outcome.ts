import type { TestType } from "@/db/enums";
import type { OutcomeInput, RunOutcome } from "./outcomes/common";
import { gravimetricOutcome } from "./outcomes/gravimetric";
import { observationOutcome } from "./outcomes/observation";
import { particleOutcome } from "./outcomes/particle";
import { rinseConductivityOutcome } from "./outcomes/rinse-conductivity";
import { wettingTensionOutcome } from "./outcomes/wetting-tension";

export type {
  Check,
  CheckKind,
  OutcomeInput,
  RunOutcome,
  SampleOutcome,
  SpecForOutcome,
} from "./outcomes/common";

/**
 * The outcome of a test run, computed from its stored raw data by the pure evaluation of its test
 * type (lib/evidence/outcomes/); nothing here is typed by a person. Every check keeps its working
 * so the screen can show it.
 */

const EVALUATE: Record<TestType, (input: OutcomeInput) => RunOutcome> = {
  particle_cleanliness: particleOutcome,
  gravimetric: gravimetricOutcome,
  wetting_tension: wettingTensionOutcome,
  rinse_conductivity: rinseConductivityOutcome,
  visual: (input) => observationOutcome("visual", input),
  uv_inspection: (input) => observationOutcome("uv_inspection", input),
  dryness: (input) => observationOutcome("dryness", input),
};

export function computeRunOutcome(input: OutcomeInput): RunOutcome {
  const evaluate = EVALUATE[input.testType] as ((input: OutcomeInput) => RunOutcome) | undefined;
  if (!evaluate)
    return {
      outcome: "incomplete",
      code: null,
      basisUnit: null,
      samples: [],
      checks: [],
      missing: [`No evaluation is defined for the test type "${String(input.testType)}".`],
    };
  let result: RunOutcome;
  try {
    result = evaluate(input);
  } catch (error) {
    // A computation that refuses its input makes the run incomplete, with its reason.
    return {
      outcome: "incomplete",
      code: null,
      basisUnit: null,
      samples: [],
      checks: [],
      missing: [(error as Error).message],
    };
  }
  if (result.samples.length === 0)
    return { ...result, missing: ["No sample recorded yet.", ...result.missing] };
  return result;
}
