import type { ParameterKind } from "@/db/enums";
import { formatNumber, rangeWithUnit } from "@/lib/format/number";

/** Parameter kinds a washer measures during a cycle (bath concentration and loading are checked elsewhere). */
export const CYCLE_VALUE_KINDS: readonly ParameterKind[] = [
  "temperature",
  "time",
  "spray_pressure",
  "flow",
  "drying_temperature",
  "vacuum_pressure",
];

export interface CycleParameter {
  key: string;
  name: string;
  kind: ParameterKind;
  unit: string;
  validatedLow: number | null;
  validatedHigh: number | null;
  critical: boolean;
}

/** A parameter whose actual value a cycle records: a measured kind, on the recipe version. */
export const isCycleValue = (p: Pick<CycleParameter, "kind">) => CYCLE_VALUE_KINDS.includes(p.kind);

/**
 * Why a cycle left its validated process, one sentence each; empty when it stayed inside. A value is
 * judged against the proven range of the recipe version in force (ISO 16232 and VDA 19.1 leave the
 * process window to the validation; holding it is the point of validating, common practice). A
 * critical measured value the cycle did not record is a flag too: an unrecorded cycle is unproven.
 * Values for parameters the version lacks are refused before this is asked.
 */
export function cycleFlags(parameters: CycleParameter[], actual: Record<string, number>): string[] {
  const reasons: string[] = [];
  for (const p of parameters) {
    const value = actual[p.key];
    if (value === undefined) {
      if (p.critical && isCycleValue(p)) reasons.push(`${p.name} was not recorded.`);
      continue;
    }
    const below = p.validatedLow !== null && value < p.validatedLow;
    const above = p.validatedHigh !== null && value > p.validatedHigh;
    if (below || above)
      reasons.push(
        `${p.name} ${formatNumber(value)} ${p.unit} is ${below ? "below" : "above"} its validated range ${rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)}.`,
      );
  }
  return reasons;
}
