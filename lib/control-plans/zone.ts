/**
 * Wall-clock times in a site's IANA time zone, computed with the runtime's own zone rules (Intl):
 * shift boundaries are local times, so a DST change moves them in UTC and makes that day's
 * shift one hour shorter or longer.
 */

export interface WallTime {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
}

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(zone: string) {
  let f = formatters.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-GB", {
      timeZone: zone,
      hourCycle: "h23",
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      second: "2-digit",
    });
    formatters.set(zone, f);
  }
  return f;
}

/** True for a zone name the runtime knows (e.g. "Europe/Berlin", "UTC"). */
export function isTimeZone(zone: string): boolean {
  try {
    formatter(zone);
    return true;
  } catch {
    return false;
  }
}

export function wallTime(at: Date, zone: string): WallTime & { second: number } {
  const parts: Record<string, number> = {};
  for (const p of formatter(zone).formatToParts(at))
    if (p.type !== "literal") parts[p.type] = Number(p.value);
  return {
    year: parts.year,
    month: parts.month,
    day: parts.day,
    hour: parts.hour,
    minute: parts.minute,
    second: parts.second,
  };
}

/** The zone's offset from UTC at an instant, in milliseconds (east positive). */
export function zoneOffsetMs(at: Date, zone: string): number {
  const w = wallTime(at, zone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return asUtc - Math.floor(at.getTime() / 1000) * 1000;
}

/**
 * The instant a local wall time names in the zone. A time that repeats when clocks go back is
 * read as its first occurrence; a time skipped when clocks go forward is read with the offset
 * before the change (so 02:30 on a spring-forward night becomes 03:30 local).
 */
export function instantOf(w: WallTime, zone: string): Date {
  const guess = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute);
  const before = guess - zoneOffsetMs(new Date(guess - 86_400_000), zone);
  const after = guess - zoneOffsetMs(new Date(guess + 86_400_000), zone);
  const names = (t: number) => {
    const back = wallTime(new Date(t), zone);
    return back.day === w.day && back.hour === w.hour && back.minute === w.minute;
  };
  const matching = [before, after].filter(names);
  return new Date(matching.length ? Math.min(...matching) : before);
}

/** The calendar day `days` after a local date (month and year roll over). */
export function addDays(w: Pick<WallTime, "year" | "month" | "day">, days: number) {
  const d = new Date(Date.UTC(w.year, w.month - 1, w.day + days));
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() };
}

/** Day of the week of a local date, Monday 0 … Sunday 6 (ISO 8601 weeks start on Monday). */
export function isoWeekday(w: Pick<WallTime, "year" | "month" | "day">): number {
  return (new Date(Date.UTC(w.year, w.month - 1, w.day)).getUTCDay() + 6) % 7;
}
