/**
 * Training states and the gate on signing "performed". Dates are calendar days (YYYY-MM-DD, UTC).
 * A training is current on the days before its expiry date and lapsed from that date on.
 */

export const TRAINING_STATES = ["current", "expires_soon", "lapsed", "never"] as const;
export type TrainingState = (typeof TRAINING_STATES)[number];
export const TRAINING_STATE_LABELS: Record<TrainingState, string> = {
  current: "Current",
  expires_soon: "Expires soon",
  lapsed: "Lapsed",
  never: "Never trained",
};

/** How long before expiry the person and My queue are reminded [practice: a month's notice to book retraining]. */
export const REMINDER_DAYS = 30;
export const DEFAULT_INTERVAL_MONTHS = 24;

const DAY_MS = 86_400_000;
const toDay = (iso: string) => Date.parse(`${iso.slice(0, 10)}T00:00:00Z`);
const fromDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** The calendar date `months` after `day`; a day the month lacks becomes its last day (31 Jan + 1 month → 28/29 Feb). */
export function addMonths(day: string, months: number): string {
  const [y, m, d] = day.split("-").map(Number);
  const total = y * 12 + (m - 1) + months;
  const year = Math.floor(total / 12);
  const month = total % 12;
  const last = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
  return fromDay(Date.UTC(year, month, Math.min(d, last)));
}

export function daysBetween(from: string, to: string): number {
  return Math.round((toDay(to) - toDay(from)) / DAY_MS);
}

/** The state of the newest training record (its expiry), on a given day. */
export function trainingState(
  expiresOn: string | null | undefined,
  today: string,
  soonDays = REMINDER_DAYS,
): TrainingState {
  if (!expiresOn) return "never";
  const left = daysBetween(today, expiresOn);
  if (left <= 0) return "lapsed";
  if (left <= soonDays) return "expires_soon";
  return "current";
}

/** The newest expiry per key among a person's records (a later sign-off supersedes an earlier one). */
export function latestExpiry<T extends { key: string; expiresOn: string }>(
  records: readonly T[],
): Map<string, string> {
  const out = new Map<string, string>();
  for (const r of records) {
    const seen = out.get(r.key);
    if (!seen || r.expiresOn > seen) out.set(r.key, r.expiresOn);
  }
  return out;
}

export interface CitedMethod {
  code: string;
  version: number;
  name: string;
}

/**
 * Why a person may not sign a run "performed": for each cited method, no training on it, or a
 * training that lapsed (with the day it lapsed). Empty when every training is current.
 */
export function trainingGateProblems(
  cited: readonly CitedMethod[],
  records: readonly { methodCode: string; expiresOn: string }[],
  today: string,
): string[] {
  const latest = latestExpiry(records.map((r) => ({ key: r.methodCode, expiresOn: r.expiresOn })));
  const problems: string[] = [];
  for (const m of cited) {
    const expiresOn = latest.get(m.code);
    const label = `${m.code} v${m.version} ${m.name}`;
    if (!expiresOn)
      problems.push(
        `You have no training on ${label}: a trainer signs off your practical training first.`,
      );
    else if (trainingState(expiresOn, today) === "lapsed")
      problems.push(
        `Your training on ${label} lapsed on ${expiresOn}: a trainer signs off your retraining first.`,
      );
  }
  return problems;
}

/** Whether a reminder is due for a record: within the notice period (or lapsed) and not yet sent for this expiry date. */
export function reminderDue(
  expiresOn: string,
  remindedFor: string | null,
  today: string,
  soonDays = REMINDER_DAYS,
): boolean {
  return remindedFor !== expiresOn && daysBetween(today, expiresOn) <= soonDays;
}
