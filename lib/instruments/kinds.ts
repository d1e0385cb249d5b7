// No path aliases here: drizzle-kit reads this file through db/schema.

/** What a register entry is. A test-ink set carries an expiry date instead of a calibration. */
export const INSTRUMENT_KINDS = [
  "balance",
  "light_microscope",
  "automated_analysis",
  "sem_edx",
  "conductivity_meter",
  "thermometer",
  "thermocouple",
  "pressure_gauge",
  "test_ink_set",
  "other",
] as const;
export type InstrumentKind = (typeof INSTRUMENT_KINDS)[number];

export const INSTRUMENT_KIND_LABELS: Record<InstrumentKind, string> = {
  balance: "Balance",
  light_microscope: "Analysis system: light microscope",
  automated_analysis: "Analysis system: automated",
  sem_edx: "Analysis system: SEM-EDX",
  conductivity_meter: "Conductivity meter",
  thermometer: "Thermometer",
  thermocouple: "Thermocouple",
  pressure_gauge: "Pressure gauge",
  test_ink_set: "Test-ink set",
  other: "Other",
};

export const INSTRUMENT_STATUSES = ["in_service", "out_of_service", "retired"] as const;
export type InstrumentStatus = (typeof INSTRUMENT_STATUSES)[number];
export const INSTRUMENT_STATUS_LABELS: Record<InstrumentStatus, string> = {
  in_service: "In service",
  out_of_service: "Out of service",
  retired: "Retired",
};

/** The result as found: "adjusted" was outside the adjustment limits but within tolerance. */
export const CALIBRATION_RESULTS = ["pass", "adjusted", "out_of_tolerance"] as const;
export type CalibrationResult = (typeof CALIBRATION_RESULTS)[number];
export const CALIBRATION_RESULT_LABELS: Record<CalibrationResult, string> = {
  pass: "Pass",
  adjusted: "Adjusted",
  out_of_tolerance: "Out of tolerance as found",
};

export const CALIBRATION_PERFORMERS = ["in_house", "external"] as const;
export type CalibrationPerformer = (typeof CALIBRATION_PERFORMERS)[number];
export const CALIBRATION_PERFORMER_LABELS: Record<CalibrationPerformer, string> = {
  in_house: "Our lab",
  external: "External calibration lab",
};
