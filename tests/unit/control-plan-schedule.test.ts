import { describe, expect, it } from "vitest";
import {
  DEFAULT_SITE_CLOCK,
  nextBoundary,
  periodStart,
  scheduleLine,
  type ScheduleInput,
  type SiteClock,
} from "@/lib/control-plans/schedule";
import { instantOf, isTimeZone } from "@/lib/control-plans/zone";
import { controlPlanLineSchema } from "@/lib/schemas/control-plan";

// Zone rules used for the check values [derived]: in the EU, summer time starts on the last Sunday
// of March at 01:00 UTC and ends on the last Sunday of October at 01:00 UTC (Directive 2000/84/EC,
// Art. 2 and 3); Berlin is UTC+1 in winter, UTC+2 in summer. In 2026 those Sundays are 29 March and
// 25 October. US Eastern time starts summer time on the second Sunday of March at 02:00 local
// (15 U.S.C. 260a): 8 March 2026, UTC-5 before, UTC-4 after.
const BERLIN: SiteClock = DEFAULT_SITE_CLOCK;
const NEW_YORK: SiteClock = {
  timeZone: "America/New_York",
  shiftStarts: ["06:00", "14:00", "22:00"],
};
const iso = (d: Date) => d.toISOString();

describe("site zone arithmetic", () => {
  it("knows IANA names and refuses made-up ones", () => {
    expect(isTimeZone("Europe/Berlin")).toBe(true);
    expect(isTimeZone("Europe/Fennmoor")).toBe(false);
  });

  it("reads a wall time skipped by spring-forward with the offset before the change [derived]", () => {
    // 02:30 does not exist on 29 March 2026 in Berlin: read as 03:30 CEST = 01:30 UTC.
    const at = instantOf({ year: 2026, month: 3, day: 29, hour: 2, minute: 30 }, "Europe/Berlin");
    expect(iso(at)).toBe("2026-03-29T01:30:00.000Z");
  });

  it("reads a wall time repeated by fall-back as its first occurrence [derived]", () => {
    // 02:30 happens twice on 25 October 2026: first at CEST (00:30 UTC), then at CET (01:30 UTC).
    const at = instantOf({ year: 2026, month: 10, day: 25, hour: 2, minute: 30 }, "Europe/Berlin");
    expect(iso(at)).toBe("2026-10-25T00:30:00.000Z");
  });
});

describe("shift boundaries in the site's zone", () => {
  it("summer shifts start at 04:00, 12:00 and 20:00 UTC in Berlin [derived]", () => {
    const at = new Date("2026-06-10T05:30:00Z"); // 07:30 local, early shift
    expect(iso(periodStart("per_shift", at, BERLIN))).toBe("2026-06-10T04:00:00.000Z");
    expect(iso(nextBoundary("per_shift", at, BERLIN))).toBe("2026-06-10T12:00:00.000Z");
  });

  it("the night shift that crosses midnight starts the evening before [derived]", () => {
    const at = new Date("2026-06-10T01:00:00Z"); // 03:00 local on the 10th
    expect(iso(periodStart("per_shift", at, BERLIN))).toBe("2026-06-09T20:00:00.000Z");
    expect(iso(nextBoundary("per_shift", at, BERLIN))).toBe("2026-06-10T04:00:00.000Z");
  });

  it("the night shift is 7 hours long when clocks go forward [derived]", () => {
    const start = periodStart("per_shift", new Date("2026-03-28T23:00:00Z"), BERLIN);
    const end = nextBoundary("per_shift", start, BERLIN);
    expect(iso(start)).toBe("2026-03-28T21:00:00.000Z"); // 22:00 CET
    expect(iso(end)).toBe("2026-03-29T04:00:00.000Z"); // 06:00 CEST
    expect((end.getTime() - start.getTime()) / 3_600_000).toBe(7);
  });

  it("the night shift is 9 hours long when clocks go back [derived]", () => {
    const start = periodStart("per_shift", new Date("2026-10-24T23:00:00Z"), BERLIN);
    const end = nextBoundary("per_shift", start, BERLIN);
    expect(iso(start)).toBe("2026-10-24T20:00:00.000Z"); // 22:00 CEST
    expect(iso(end)).toBe("2026-10-25T05:00:00.000Z"); // 06:00 CET
    expect((end.getTime() - start.getTime()) / 3_600_000).toBe(9);
  });

  it("follows another zone's rules: New York's early shift moves an hour in UTC on 8 March 2026 [derived]", () => {
    expect(iso(nextBoundary("per_shift", new Date("2026-03-07T07:00:00Z"), NEW_YORK))).toBe(
      "2026-03-07T11:00:00.000Z",
    );
    expect(iso(nextBoundary("per_shift", new Date("2026-03-08T07:30:00Z"), NEW_YORK))).toBe(
      "2026-03-08T10:00:00.000Z",
    );
  });

  it("a day is local midnight to midnight: 23 hours on the spring-forward Sunday [derived]", () => {
    const start = periodStart("daily", new Date("2026-03-29T12:00:00Z"), BERLIN);
    const end = nextBoundary("daily", start, BERLIN);
    expect(iso(start)).toBe("2026-03-28T23:00:00.000Z");
    expect(iso(end)).toBe("2026-03-29T22:00:00.000Z");
  });

  it("a week starts on Monday 00:00 local (ISO 8601) [memory] ISO 8601 weeks begin on Monday", () => {
    // Wednesday 10 June 2026 → Monday 8 June and Monday 15 June, both 00:00 CEST = 22:00 UTC the day before.
    const at = new Date("2026-06-10T10:00:00Z");
    expect(iso(periodStart("weekly", at, BERLIN))).toBe("2026-06-07T22:00:00.000Z");
    expect(iso(nextBoundary("weekly", at, BERLIN))).toBe("2026-06-14T22:00:00.000Z");
  });
});

const base: Omit<ScheduleInput, "frequency" | "now"> = {
  everyN: null,
  effectiveFrom: "2026-06-01T08:00:00.000Z",
  lastDoneAt: null,
  cycleStarts: [],
  newLotStarts: [],
  clock: BERLIN,
};

describe("when the next routine test is due", () => {
  it("per shift: due from the next shift, overdue when that shift ends", () => {
    const line = {
      ...base,
      frequency: "per_shift" as const,
      lastDoneAt: "2026-06-10T05:30:00.000Z",
    };
    const at = (now: string) => scheduleLine({ ...line, now: new Date(now) });
    expect(at("2026-06-10T11:59:00Z")).toEqual({
      dueAt: "2026-06-10T12:00:00.000Z",
      overdueAt: "2026-06-10T20:00:00.000Z",
      state: "ok",
    });
    expect(at("2026-06-10T12:00:00Z").state).toBe("due");
    expect(at("2026-06-10T19:59:59Z").state).toBe("due");
    expect(at("2026-06-10T20:00:00Z").state).toBe("overdue");
  });

  it("daily: a test at 23:30 local counts for that local day, not the UTC one [derived]", () => {
    const r = scheduleLine({
      ...base,
      frequency: "daily",
      lastDoneAt: "2026-06-10T21:30:00.000Z", // 23:30 CEST on 10 June
      now: new Date("2026-06-10T22:30:00Z"), // 00:30 CEST on 11 June
    });
    expect(r).toEqual({
      dueAt: "2026-06-10T22:00:00.000Z",
      overdueAt: "2026-06-11T22:00:00.000Z",
      state: "due",
    });
  });

  it("weekly: due from next Monday, overdue the Monday after", () => {
    const r = scheduleLine({
      ...base,
      frequency: "weekly",
      lastDoneAt: "2026-06-10T10:00:00.000Z",
      now: new Date("2026-06-22T08:00:00Z"),
    });
    expect(r).toEqual({
      dueAt: "2026-06-14T22:00:00.000Z",
      overdueAt: "2026-06-21T22:00:00.000Z",
      state: "overdue",
    });
  });

  it("with no test yet, a timed test is due from the plan's start and overdue when its period ends", () => {
    const r = scheduleLine({
      ...base,
      frequency: "per_shift",
      now: new Date("2026-06-01T09:00:00Z"),
    });
    expect(r).toEqual({
      dueAt: "2026-06-01T08:00:00.000Z",
      overdueAt: "2026-06-01T12:00:00.000Z",
      state: "due",
    });
  });

  it("a test from before the plan took effect starts nothing: the first is due from the plan's start", () => {
    const r = scheduleLine({
      ...base,
      frequency: "daily",
      lastDoneAt: "2026-05-20T08:00:00.000Z",
      now: new Date("2026-06-01T09:00:00Z"),
    });
    // Plan effective 2026-06-01 08:00 UTC = 10:00 CEST; that local day ends at 22:00 UTC.
    expect(r).toEqual({
      dueAt: "2026-06-01T08:00:00.000Z",
      overdueAt: "2026-06-01T22:00:00.000Z",
      state: "due",
    });
  });

  it("every N cycles: due at the N-th cycle since the last test, overdue at the 2N-th", () => {
    const starts = [1, 2, 3, 4, 5, 6].map((h) => `2026-06-10T0${h}:00:00.000Z`);
    const line = {
      ...base,
      frequency: "every_n_cycles" as const,
      everyN: 3,
      now: new Date("2026-06-11T00:00:00Z"),
    };
    expect(scheduleLine({ ...line, cycleStarts: starts.slice(0, 2) })).toEqual({
      dueAt: null,
      overdueAt: null,
      state: "ok",
    });
    expect(scheduleLine({ ...line, cycleStarts: starts.slice(0, 5) })).toEqual({
      dueAt: "2026-06-10T03:00:00.000Z",
      overdueAt: null,
      state: "due",
    });
    expect(scheduleLine({ ...line, cycleStarts: starts })).toEqual({
      dueAt: "2026-06-10T03:00:00.000Z",
      overdueAt: "2026-06-10T06:00:00.000Z",
      state: "overdue",
    });
  });

  it("every cycle (N = 1): the first cycle since makes it due, the second overdue", () => {
    const line = {
      ...base,
      frequency: "every_n_cycles" as const,
      everyN: 1,
      now: new Date("2026-06-11T00:00:00Z"),
    };
    expect(scheduleLine({ ...line, cycleStarts: ["2026-06-10T01:00:00.000Z"] }).state).toBe("due");
    expect(
      scheduleLine({
        ...line,
        cycleStarts: ["2026-06-10T01:00:00.000Z", "2026-06-10T02:00:00.000Z"],
      }).state,
    ).toBe("overdue");
  });

  it("per lot: a new lot makes it due, a second new lot overdue", () => {
    const line = { ...base, frequency: "per_lot" as const, now: new Date("2026-06-11T00:00:00Z") };
    expect(scheduleLine(line).state).toBe("ok");
    expect(scheduleLine({ ...line, newLotStarts: ["2026-06-10T01:00:00.000Z"] })).toEqual({
      dueAt: "2026-06-10T01:00:00.000Z",
      overdueAt: null,
      state: "due",
    });
    expect(
      scheduleLine({
        ...line,
        newLotStarts: ["2026-06-10T01:00:00.000Z", "2026-06-10T05:00:00.000Z"],
      }).overdueAt,
    ).toBe("2026-06-10T05:00:00.000Z");
  });
});

describe("control plan line input", () => {
  const good = {
    characteristic: "particle_cleanliness",
    method: "Pressure rinse extraction, 10 µm membrane",
    stageId: "",
    sampleSize: "5",
    minCycles: "3",
    frequency: "every_n_cycles",
    everyN: "20",
    reactionPlan: "Hold the lots since the last pass; raise a nonconformance.",
  };
  const errors = (over: Record<string, string>) => {
    const r = controlPlanLineSchema.safeParse({ ...good, ...over });
    return r.success
      ? {}
      : Object.fromEntries(r.error.issues.map((i) => [i.path.join("."), i.message]));
  };

  it("takes a complete line", () => {
    expect(errors({})).toEqual({});
  });

  it("refuses N ≤ 0, a sample size of 0 and an empty reaction plan beside their fields", () => {
    expect(Object.keys(errors({ everyN: "0" }))).toEqual(["everyN"]);
    expect(Object.keys(errors({ everyN: "-2" }))).toEqual(["everyN"]);
    expect(Object.keys(errors({ sampleSize: "0", minCycles: "" }))).toEqual(["sampleSize"]);
    expect(Object.keys(errors({ reactionPlan: "   " }))).toEqual(["reactionPlan"]);
  });

  it("names every field's mistake in one answer: a negative sample size beside unreadable counts", () => {
    const e = errors({ sampleSize: "-2", minCycles: "abc", everyN: "ten" });
    expect(Object.keys(e).sort()).toEqual(["everyN", "minCycles", "sampleSize"]);
    expect(e.sampleSize).toMatch(/below 1 tests nothing/);
  });

  it("asks a bath line for its tank and refuses distinct cycles on it", () => {
    expect(Object.keys(errors({ characteristic: "ph", minCycles: "" }))).toEqual(["stageId"]);
    expect(Object.keys(errors({ characteristic: "ph", stageId: crypto.randomUUID() }))).toEqual([
      "minCycles",
    ]);
  });
});
