import type { DueState, Frequency } from "./characteristics";
import { addDays, instantOf, isoWeekday, wallTime, type WallTime } from "./zone";

/** The site's working pattern: shift start times ("HH:MM", local) in an IANA zone. */
export interface SiteClock {
  timeZone: string;
  shiftStarts: readonly string[];
}

export const DEFAULT_SITE_CLOCK: SiteClock = {
  timeZone: "Europe/Berlin",
  shiftStarts: ["06:00", "14:00", "22:00"],
};

export type PeriodKind = "per_shift" | "daily" | "weekly";

function minutesOf(hhmm: string) {
  const [h, m] = hhmm.split(":").map(Number);
  return { hour: h, minute: m };
}

/** The boundaries of one local day's periods, as instants, in order. */
function boundariesOnDay(
  kind: PeriodKind,
  day: Pick<WallTime, "year" | "month" | "day">,
  clock: SiteClock,
): Date[] {
  if (kind === "per_shift") {
    return [...clock.shiftStarts]
      .sort()
      .map((s) => instantOf({ ...day, ...minutesOf(s) }, clock.timeZone));
  }
  if (kind === "weekly" && isoWeekday(day) !== 0) return [];
  return [instantOf({ ...day, hour: 0, minute: 0 }, clock.timeZone)];
}

/** The first period boundary strictly after an instant (next shift start, next local midnight, next Monday 00:00). */
export function nextBoundary(kind: PeriodKind, after: Date, clock: SiteClock): Date {
  const today = wallTime(after, clock.timeZone);
  for (let d = 0; d <= 8; d++) {
    const found = boundariesOnDay(kind, addDays(today, d), clock).find(
      (b) => b.getTime() > after.getTime(),
    );
    if (found) return found;
  }
  throw new Error("No period boundary within eight days: the site has no shift start times.");
}

/** The period boundary at or before an instant: when the shift, day or week holding it began. */
export function periodStart(kind: PeriodKind, at: Date, clock: SiteClock): Date {
  const today = wallTime(at, clock.timeZone);
  for (let d = 0; d >= -8; d--) {
    const found = boundariesOnDay(kind, addDays(today, d), clock)
      .filter((b) => b.getTime() <= at.getTime())
      .at(-1);
    if (found) return found;
  }
  throw new Error("No period boundary within eight days: the site has no shift start times.");
}

export interface ScheduleInput {
  frequency: Frequency;
  /** N of "every N cycles". */
  everyN: number | null;
  /** When the plan version took effect: with no satisfying record yet, counting starts here. */
  effectiveFrom: string;
  /**
   * The newest satisfying record: a verified run of the test type on the combination, or a reading
   * of the value on the tank. One from before `effectiveFrom` is not counted.
   */
  lastDoneAt: string | null;
  /**
   * Starts of the combination's wash cycles after the reference (the later of the last record and
   * the plan's start), oldest first; only the first 2 N are needed for "every N cycles".
   */
  cycleStarts: readonly string[];
  /** For "per lot": when each lot first washed after the reference was first washed, oldest first (two suffice). */
  newLotStarts: readonly string[];
  now: Date;
  clock: SiteClock;
}

export interface ScheduleResult {
  /** When the next test became (or becomes) due; null while a cycle or lot count has not been reached. */
  dueAt: string | null;
  /** When it becomes overdue: one more interval of grace after it falls due. */
  overdueAt: string | null;
  state: DueState;
}

function stateAt(now: Date, dueAt: Date | null, overdueAt: Date | null): DueState {
  if (overdueAt && now.getTime() >= overdueAt.getTime()) return "overdue";
  if (dueAt && now.getTime() >= dueAt.getTime()) return "due";
  return "ok";
}

/**
 * When a control-plan line's next test is due, and whether it is due or overdue now.
 *
 * - Per shift, daily, weekly: a test in one period makes the next due at the start of the next
 *   period and overdue when that period ends. With none yet, the test is due from the plan's start
 *   and overdue at the end of the period it started in.
 * - Every N cycles: due when the N-th cycle since the last test starts, overdue when the 2N-th does.
 * - Per lot: due when a lot is first washed after the last test, overdue when a second new lot is.
 */
export function scheduleLine(input: ScheduleInput): ScheduleResult {
  // A test before the plan took effect starts nothing: a new plan's first test is due from its start.
  const lastDoneAt =
    input.lastDoneAt !== null && input.lastDoneAt >= input.effectiveFrom ? input.lastDoneAt : null;
  const reference = new Date(lastDoneAt ?? input.effectiveFrom);
  const iso = (d: Date | null) => (d ? d.toISOString() : null);
  const result = (dueAt: Date | null, overdueAt: Date | null): ScheduleResult => ({
    dueAt: iso(dueAt),
    overdueAt: iso(overdueAt),
    state: stateAt(input.now, dueAt, overdueAt),
  });
  const at = (s: string | undefined) => (s === undefined ? null : new Date(s));
  switch (input.frequency) {
    case "per_shift":
    case "daily":
    case "weekly": {
      const kind = input.frequency;
      if (lastDoneAt === null) {
        return result(reference, nextBoundary(kind, reference, input.clock));
      }
      const dueAt = nextBoundary(kind, reference, input.clock);
      return result(dueAt, nextBoundary(kind, dueAt, input.clock));
    }
    case "every_n_cycles": {
      const n = input.everyN ?? 1;
      if (!Number.isInteger(n) || n < 1) throw new Error("Every N cycles needs N ≥ 1.");
      return result(at(input.cycleStarts[n - 1]), at(input.cycleStarts[2 * n - 1]));
    }
    case "per_lot":
      return result(at(input.newLotStarts[0]), at(input.newLotStarts[1]));
  }
}
