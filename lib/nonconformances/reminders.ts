/** Days before a due date when the owner is first reminded (common practice, as for bath maintenance). */
export const NC_REMIND_DAYS_BEFORE = 2;

const DAY_MS = 86_400_000;
const dayOf = (date: string) => Date.parse(`${date}T00:00:00Z`);

/** "due" from two days before the date, "overdue" after it, or null while it is further off. */
export function reminderLevel(dueOn: string, today: string): "due" | "overdue" | null {
  if (dayOf(today) > dayOf(dueOn)) return "overdue";
  return dayOf(today) >= dayOf(dueOn) - NC_REMIND_DAYS_BEFORE * DAY_MS ? "due" : null;
}
