import type { BathRecordKind } from "@/db/enums";

export type MaintenanceState = "ok" | "due" | "overdue";

export interface MaintenanceStatus {
  dueAt: string;
  state: MaintenanceState;
  lastDoneAt: string | null;
}

const DAY_MS = 86_400_000;

/**
 * When a tank's bath change, filter change or reading is next due: the interval
 * counted from the last time it was done (or from when the interval was set, if
 * never). Due within `warnDays` of that date, overdue after it.
 */
export function maintenanceStatus(
  input: { intervalDays: number; warnDays: number; lastDoneAt: string | null; since: string },
  now: Date,
): MaintenanceStatus {
  const from = new Date(input.lastDoneAt ?? input.since).getTime();
  const due = from + input.intervalDays * DAY_MS;
  const state: MaintenanceState =
    now.getTime() > due ? "overdue" : now.getTime() >= due - input.warnDays * DAY_MS ? "due" : "ok";
  return { dueAt: new Date(due).toISOString(), state, lastDoneAt: input.lastDoneAt };
}

export const MAINTENANCE_LABELS: Record<BathRecordKind, string> = {
  bath_change: "Bath change",
  filter_change: "Filter change",
  reading: "Bath reading",
  addition: "Detergent top-up",
  nozzle_check: "Nozzle check",
  ultrasonic_foil_test: "Ultrasonic foil test",
};

export const STATE_LABELS: Record<MaintenanceState, string> = {
  ok: "In date",
  due: "Due",
  overdue: "Overdue",
};

/** The monitored bath values that get a control chart, with their units. */
export const BATH_VARIABLES = {
  concentrationPct: { label: "Detergent concentration", unit: "%" },
  conductivityUsPerCm: { label: "Bath conductivity", unit: "µS/cm" },
  temperatureC: { label: "Bath temperature", unit: "°C" },
  ph: { label: "pH", unit: "pH" },
  oilContentGPerL: { label: "Oil content", unit: "g/L" },
} as const;
export type BathVariable = keyof typeof BATH_VARIABLES;
