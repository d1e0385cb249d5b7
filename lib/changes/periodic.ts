/** Periodic requalification of a validated recipe version × part family. */
export const DUE_SOON_DAYS = 30;

export function requalificationDue(lastQualifiedAt: string, intervalMonths: number): string {
  const d = new Date(lastQualifiedAt);
  const day = d.getUTCDate();
  d.setUTCDate(1);
  d.setUTCMonth(d.getUTCMonth() + intervalMonths);
  // 31 January + 1 month is the last day of February, not 3 March.
  const last = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + 1, 0)).getUTCDate();
  d.setUTCDate(Math.min(day, last));
  return d.toISOString();
}

export function dueState(
  due: string,
  now: Date,
  soonDays = DUE_SOON_DAYS,
): "overdue" | "due_soon" | "not_due" {
  if (due < now.toISOString()) return "overdue";
  return new Date(due).getTime() - now.getTime() <= soonDays * 86_400_000 ? "due_soon" : "not_due";
}
