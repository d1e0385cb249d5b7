import type { ParameterKind } from "@/db/enums";

/** The units each kind of recipe parameter may be written in; the first is the usual one. */
export const UNITS_BY_KIND: Record<ParameterKind, readonly string[]> = {
  temperature: ["°C"],
  time: ["s", "min"],
  concentration: ["%", "g/L"],
  ultrasonic_power: ["W/L", "W"],
  ultrasonic_frequency: ["kHz"],
  spray_pressure: ["bar"],
  flow: ["L/min", "m³/h"],
  conductivity_limit: ["µS/cm"],
  drying_temperature: ["°C"],
  vacuum_pressure: ["mbar"],
  basket_loading: ["parts/basket"],
  load_pattern: ["pattern no."],
  fixture: ["fixture no."],
  filter_interval: ["h", "d", "cycles"],
  other: [],
};

export const PARAMETER_KIND_LABELS: Record<ParameterKind, string> = {
  temperature: "Bath temperature",
  time: "Time",
  concentration: "Detergent concentration",
  ultrasonic_power: "Ultrasonic power",
  ultrasonic_frequency: "Ultrasonic frequency",
  spray_pressure: "Spray or injection pressure",
  flow: "Flow",
  conductivity_limit: "Rinse-water conductivity limit",
  drying_temperature: "Drying temperature",
  vacuum_pressure: "Vacuum end pressure",
  basket_loading: "Basket loading",
  load_pattern: "Load pattern",
  fixture: "Fixture",
  filter_interval: "Filter change interval",
  other: "Other",
};

export function unitFits(kind: ParameterKind, unit: string): boolean {
  const allowed = UNITS_BY_KIND[kind];
  return allowed.length === 0 ? unit.trim().length > 0 : allowed.includes(unit);
}

/** Factors to a common base per unit family, so "240 s" and "4 min" compare as equal. */
const TO_BASE: Record<string, { family: string; factor: number }> = {
  s: { family: "time", factor: 1 },
  min: { family: "time", factor: 60 },
  h: { family: "interval", factor: 1 },
  d: { family: "interval", factor: 24 },
};

/** Converts a value between two units of the same family, or null when they do not convert. */
export function convert(value: number, from: string, to: string): number | null {
  if (from === to) return value;
  const a = TO_BASE[from];
  const b = TO_BASE[to];
  if (!a || !b || a.family !== b.family) return null;
  return (value * a.factor) / b.factor;
}

export interface ParameterCheckInput {
  kind: ParameterKind;
  unit: string;
  setpoint: number;
  validatedLow: number | null;
  validatedHigh: number | null;
  /** The stage the parameter belongs to: an aqueous bath is open wash or rinse water. */
  stageKind: string;
}

/** A setpoint outside the validated range written beside it contradicts itself. */
export function ownRangeProblem(
  p: Pick<ParameterCheckInput, "setpoint" | "validatedLow" | "validatedHigh" | "unit">,
): ParameterProblem | null {
  const below = p.validatedLow !== null && p.setpoint < p.validatedLow;
  const above = p.validatedHigh !== null && p.setpoint > p.validatedHigh;
  if (!below && !above) return null;
  return {
    field: "setpoint",
    message: `The setpoint ${p.setpoint} ${p.unit} lies outside its own validated range ${p.validatedLow ?? "−∞"}–${p.validatedHigh ?? "∞"} ${p.unit}.`,
  };
}

export interface ParameterProblem {
  field: "unit" | "setpoint" | "validatedLow" | "validatedHigh";
  message: string;
}

const AQUEOUS_STAGES = new Set(["wash", "rinse", "final_rinse"]);

/**
 * Physically impossible values and inconsistent ranges. Limits are physical
 * (water boils at about 100 °C at atmospheric pressure in an open tank; a time
 * or a concentration is never negative; a vacuum is below atmospheric pressure,
 * about 1013 mbar), not process limits: those are the validated range.
 */
export function parameterProblems(p: ParameterCheckInput): ParameterProblem[] {
  const problems: ParameterProblem[] = [];
  if (!unitFits(p.kind, p.unit)) {
    const allowed = UNITS_BY_KIND[p.kind];
    problems.push({
      field: "unit",
      message: allowed.length
        ? `${PARAMETER_KIND_LABELS[p.kind]} is given in ${allowed.join(" or ")}, not "${p.unit}".`
        : "Give the unit.",
    });
    return problems;
  }
  const values: [ParameterProblem["field"], number | null, string][] = [
    ["setpoint", p.setpoint, "setpoint"],
    ["validatedLow", p.validatedLow, "validated low"],
    ["validatedHigh", p.validatedHigh, "validated high"],
  ];
  for (const [field, value, label] of values) {
    if (value === null) continue;
    const message = impossible(p, value, label);
    if (message) problems.push({ field, message });
  }
  if (p.validatedLow !== null && p.validatedHigh !== null && p.validatedLow > p.validatedHigh) {
    problems.push({
      field: "validatedLow",
      message: `The validated low (${p.validatedLow} ${p.unit}) is above the validated high (${p.validatedHigh} ${p.unit}).`,
    });
  }
  return problems;
}

/**
 * Upper bounds beyond which a value is a typing error, not a process: no aqueous washer's dryer
 * runs above 200 °C, no step lasts a day, ultrasonic cleaning runs at about 20–400 kHz and tens of
 * W/L, washer pumps reach a few hundred bar (high-pressure deburring about 1000), and a rinse-water
 * limit above 10 000 µS/cm (brackish water) limits nothing [practice].
 */
const UPPER: Partial<Record<ParameterKind, Record<string, number>>> = {
  drying_temperature: { "°C": 200 },
  time: { s: 86_400, min: 1_440 },
  concentration: { "g/L": 1_000 },
  ultrasonic_power: { "W/L": 100, W: 100_000 },
  ultrasonic_frequency: { kHz: 400 },
  spray_pressure: { bar: 1_000 },
  flow: { "L/min": 10_000, "m³/h": 600 },
  conductivity_limit: { "µS/cm": 10_000 },
  basket_loading: { "parts/basket": 100_000 },
  filter_interval: { h: 8_760, d: 365, cycles: 1_000_000 },
};

function impossible(p: ParameterCheckInput, value: number, label: string): string | null {
  const at = `${value} ${p.unit}`;
  if (!Number.isFinite(value)) return `The ${label} must be a finite number.`;
  const upper = UPPER[p.kind]?.[p.unit];
  if (upper !== undefined && value > upper)
    return `A ${label} of ${at} is above ${upper} ${p.unit}, beyond what a parts washer can run: check the value.`;
  if (p.kind === "ultrasonic_frequency" && value > 0 && value < 15)
    return `Ultrasonic cleaning runs at about 20 kHz and above: a ${label} of ${at} is audible sound, not ultrasound.`;
  switch (p.kind) {
    case "temperature":
      if (AQUEOUS_STAGES.has(p.stageKind) && value > 100)
        return `An open aqueous bath boils at about 100 °C: a ${label} of ${at} is not possible.`;
      if (value < 0)
        return `An aqueous bath freezes below 0 °C: a ${label} of ${at} is not possible.`;
      if (value > 100)
        return `A ${label} of ${at} is above the boiling point of water in an open tank.`;
      return null;
    case "drying_temperature":
      return value < 0 ? `A ${label} of ${at} is not possible for a dryer.` : null;
    case "time":
      return value < 0 ? `A time cannot be negative: ${label} ${at}.` : null;
    case "filter_interval":
      return value <= 0
        ? `A filter change interval must be greater than zero: ${label} ${at}.`
        : null;
    case "concentration":
      if (value < 0) return `A concentration cannot be negative: ${label} ${at}.`;
      return p.unit === "%" && value > 100
        ? `A concentration cannot exceed 100 %: ${label} ${at}.`
        : null;
    case "vacuum_pressure":
      if (value < 0) return `An absolute pressure cannot be negative: ${label} ${at}.`;
      return value > 1013
        ? `A vacuum is below atmospheric pressure (about 1013 mbar): ${label} ${at}.`
        : null;
    case "basket_loading":
      return value < 1 || !Number.isInteger(value)
        ? `Basket loading is a whole number of parts, at least 1: ${label} ${at}.`
        : null;
    case "load_pattern":
    case "fixture":
      return value < 1 || !Number.isInteger(value)
        ? `A ${PARAMETER_KIND_LABELS[p.kind].toLowerCase()} is named by its sheet number, a whole number from 1: ${label} ${at}.`
        : null;
    case "ultrasonic_frequency":
    case "ultrasonic_power":
    case "spray_pressure":
    case "flow":
    case "conductivity_limit":
      return value < 0 ? `A ${label} of ${at} cannot be negative.` : null;
    default:
      return null;
  }
}
