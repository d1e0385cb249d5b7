import type { TestType } from "@/lib/recipes/test-types";

/** What a control-plan line checks. Most are a test run's type; the bath ones are a tank reading. */
export const CHARACTERISTICS = [
  "particle_cleanliness",
  "gravimetric_residue",
  "wetting_tension",
  "visual",
  "dryness",
  "final_rinse_conductivity",
  "bath_concentration",
  "ph",
  "temperature",
  "oil_content",
] as const;
export type Characteristic = (typeof CHARACTERISTICS)[number];

export const CHARACTERISTIC_LABELS: Record<Characteristic, string> = {
  particle_cleanliness: "Particle cleanliness",
  gravimetric_residue: "Gravimetric residue",
  wetting_tension: "Wetting tension",
  visual: "Visual",
  dryness: "Dryness",
  final_rinse_conductivity: "Final-rinse conductivity",
  bath_concentration: "Bath concentration",
  ph: "pH",
  temperature: "Temperature",
  oil_content: "Oil content",
};

/** The run's test type that satisfies a line, for the characteristics tested on parts or rinse water. */
export const CHARACTERISTIC_TEST_TYPE: Partial<Record<Characteristic, TestType>> = {
  particle_cleanliness: "particle_cleanliness",
  gravimetric_residue: "gravimetric",
  wetting_tension: "wetting_tension",
  visual: "visual",
  dryness: "dryness",
  final_rinse_conductivity: "rinse_conductivity",
};

/** The tank reading's value that satisfies a line, for the bath characteristics (the reading names its tank). */
export const CHARACTERISTIC_BATH_VALUE = {
  bath_concentration: "concentrationPct",
  ph: "ph",
  temperature: "temperatureC",
  oil_content: "oilContentGPerL",
} as const satisfies Partial<Record<Characteristic, string>>;

export type BathCharacteristic = keyof typeof CHARACTERISTIC_BATH_VALUE;

export function isBathCharacteristic(c: Characteristic): c is BathCharacteristic {
  return c in CHARACTERISTIC_BATH_VALUE;
}

/**
 * Samples from several cycles are independent samples; a tank reading is one value of one bath.
 * So the minimum of distinct cycles applies to the part tests only.
 */
export function takesMinCycles(c: Characteristic): boolean {
  return !isBathCharacteristic(c) && c !== "final_rinse_conductivity";
}

/** "1 part", "5 parts", "1 reading", "2 water samples": what a line's sample size counts. */
export function sampleWords(c: Characteristic, n: number): string {
  const [one, many] = isBathCharacteristic(c)
    ? ["reading", "readings"]
    : c === "final_rinse_conductivity"
      ? ["water sample", "water samples"]
      : ["part", "parts"];
  return `${n} ${n === 1 ? one : many}`;
}

export const FREQUENCIES = ["every_n_cycles", "per_shift", "daily", "weekly", "per_lot"] as const;
export type Frequency = (typeof FREQUENCIES)[number];

export const FREQUENCY_LABELS: Record<Frequency, string> = {
  every_n_cycles: "Every N cycles",
  per_shift: "Per shift",
  daily: "Daily",
  weekly: "Weekly",
  per_lot: "Per lot",
};

export function frequencyWords(frequency: Frequency, everyN: number | null): string {
  if (frequency === "every_n_cycles")
    return everyN === 1 ? "Every cycle" : `Every ${everyN ?? "N"} cycles`;
  return FREQUENCY_LABELS[frequency];
}

export const CONTROL_PLAN_STATUSES = [
  "draft",
  "in_review",
  "reviewed",
  "effective",
  "superseded",
] as const;
export type ControlPlanStatus = (typeof CONTROL_PLAN_STATUSES)[number];

export const CONTROL_PLAN_STATUS_LABELS: Record<ControlPlanStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  reviewed: "Reviewed",
  effective: "Approved, effective",
  superseded: "Superseded",
};

export const DUE_STATES = ["ok", "due", "overdue"] as const;
export type DueState = (typeof DUE_STATES)[number];
export const DUE_STATE_LABELS: Record<DueState, string> = {
  ok: "Not yet due",
  due: "Due",
  overdue: "Overdue",
};
