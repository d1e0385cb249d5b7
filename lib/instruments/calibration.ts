import { daysInMonth } from "@/lib/schemas/date";
import {
  INSTRUMENT_KIND_LABELS,
  type CalibrationResult,
  type InstrumentKind,
  type InstrumentStatus,
} from "./kinds";

export const usesExpiry = (kind: InstrumentKind) => kind === "test_ink_set";

/** How many days before its due date a calibration shows as due (common practice: a month's notice). */
export const DUE_SOON_DAYS = 30;

const DAY_MS = 86_400_000;
const toDay = (date: string) => Date.parse(`${date}T00:00:00Z`);
const fromDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

export function addDays(date: string, days: number): string {
  return fromDay(toDay(date) + days * DAY_MS);
}

/**
 * The due date an interval in months gives: the same day of the month, or the month's last day
 * when it has no such day (31 January + 1 month = 28 or 29 February).
 */
export function dueDateFrom(calibratedOn: string, intervalMonths: number): string {
  const [y, m, d] = calibratedOn.split("-").map(Number);
  const months = m - 1 + intervalMonths;
  const year = y + Math.floor(months / 12);
  const month = (months % 12) + 1;
  const day = Math.min(d, daysInMonth(year, month));
  return `${year}-${String(month).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
}

export type DueState = "current" | "due_soon" | "overdue" | "never_calibrated" | "not_tracked";
export const DUE_STATE_LABELS: Record<DueState, string> = {
  current: "Current",
  due_soon: "Due soon",
  overdue: "Overdue",
  never_calibrated: "No calibration on record",
  not_tracked: "Retired",
};

export interface InstrumentDue {
  kind: InstrumentKind;
  status: InstrumentStatus;
  /** The latest calibration's due date, or a test-ink set's expiry date. */
  dueOn: string | null;
}

/**
 * Where an instrument stands on `today`: it may be used up to and including its due date (or a
 * test-ink set's expiry date) and is overdue from the day after.
 */
export function dueState(instrument: InstrumentDue, today: string): DueState {
  if (instrument.status === "retired") return "not_tracked";
  if (!instrument.dueOn) return "never_calibrated";
  if (today > instrument.dueOn) return "overdue";
  if (today >= addDays(instrument.dueOn, -DUE_SOON_DAYS)) return "due_soon";
  return "current";
}

/** The first day an instrument is past its due date. */
export const overdueSince = (dueOn: string) => addDays(dueOn, 1);

export interface CitedInstrument extends InstrumentDue {
  assetNumber: string;
  description: string;
}

/**
 * Why a run citing these instruments cannot be signed "performed" on `today`, in plain words that
 * name each instrument and since when it is overdue; null when every one may be used.
 */
export function calibrationSigningProblem(
  cited: readonly CitedInstrument[],
  today: string,
): string | null {
  const problems: string[] = [];
  for (const i of cited) {
    const name = `${INSTRUMENT_KIND_LABELS[i.kind]} ${i.assetNumber} (${i.description})`;
    const ink = usesExpiry(i.kind);
    const state = dueState(i, today);
    if (state === "overdue")
      problems.push(
        ink
          ? `${name} is past its expiry date (${i.dueOn}): expired since ${overdueSince(i.dueOn!)}.`
          : `${name} is past its calibration due date (${i.dueOn}): overdue since ${overdueSince(i.dueOn!)}.`,
      );
    else if (state === "never_calibrated")
      problems.push(`${name} ${ink ? "has no expiry date" : "has no calibration on record"}.`);
    else if (state === "not_tracked") problems.push(`${name} is retired.`);
  }
  if (problems.length === 0) return null;
  return `Not signed: ${problems.join(" ")} Record its calibration (for a test-ink set, the new set's expiry date) or remove it from the run, then sign.`;
}

export interface CalibrationEntry {
  id: string;
  calibratedOn: string;
  result: CalibrationResult;
}

/** The latest calibration before `before` whose result as found was within tolerance. */
export function lastPassingCalibration(
  calibrations: readonly CalibrationEntry[],
  before: CalibrationEntry,
): CalibrationEntry | null {
  let best: CalibrationEntry | null = null;
  for (const c of calibrations) {
    if (c.id === before.id || c.result === "out_of_tolerance") continue;
    if (c.calibratedOn > before.calibratedOn) continue;
    if (!best || c.calibratedOn > best.calibratedOn) best = c;
  }
  return best;
}

export interface CitingRun {
  id: string;
  label: string;
  /** The run's test date, or its opening time when it has none. */
  at: string;
}

/**
 * The runs that relied on an instrument found out of tolerance: those that cited it from its last
 * passing calibration (that day included) up to the calibration that found it out (included). With
 * no earlier passing calibration every citing run up to then is suspect.
 */
export function suspectRuns(
  runs: readonly CitingRun[],
  lastPass: { calibratedOn: string } | null,
  foundOn: string,
): CitingRun[] {
  return runs
    .filter((r) => {
      const day = r.at.slice(0, 10);
      return (!lastPass || day >= lastPass.calibratedOn) && day <= foundOn;
    })
    .sort((a, b) => a.at.localeCompare(b.at) || a.label.localeCompare(b.label));
}
