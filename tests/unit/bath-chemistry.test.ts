import { describe, expect, it } from "vitest";
import { concentrationFromTitration } from "@/lib/bath/titration";
import {
  bathAgeDays,
  evaluateReading,
  evaluateReadingValues,
  limitOrderProblems,
  type BathLimits,
} from "@/lib/bath/limits";

const plan: BathLimits = {
  target: 3,
  actionLow: 2.5,
  actionHigh: 3.5,
  rejectLow: 2,
  rejectHigh: 4,
};

describe("titration", () => {
  it("multiplies the titrant volume by the detergent's factor", () => {
    // [practice] supplier data sheets state "% = mL titrant × factor"; 6.2 mL × 0.5 %/mL = 3.1 %.
    expect(concentrationFromTitration({ titrantVolumeMl: 6.2, factorPctPerMl: 0.5 })).toBe(3.1);
    // [derived] no titrant to the end point means no alkaline detergent in the sample.
    expect(concentrationFromTitration({ titrantVolumeMl: 0, factorPctPerMl: 0.5 })).toBe(0);
  });
  it("refuses a zero factor and a negative volume", () => {
    expect(() => concentrationFromTitration({ titrantVolumeMl: 5, factorPctPerMl: 0 })).toThrow(
      /factor/,
    );
    expect(() => concentrationFromTitration({ titrantVolumeMl: -1, factorPctPerMl: 0.5 })).toThrow(
      /volume/,
    );
  });
});

describe("limit evaluation", () => {
  it("grades a value against the action and reject bands, a value on a limit being within it", () => {
    expect(evaluateReading(3, plan).state).toBe("ok");
    expect(evaluateReading(3.5, plan).state).toBe("ok");
    expect(evaluateReading(3.6, plan)).toEqual({ state: "action", side: "high", limit: 3.5 });
    expect(evaluateReading(2.4, plan)).toEqual({ state: "action", side: "low", limit: 2.5 });
    expect(evaluateReading(4.01, plan)).toEqual({ state: "reject", side: "high", limit: 4 });
    expect(evaluateReading(1.9, plan)).toEqual({ state: "reject", side: "low", limit: 2 });
  });
  it("takes a one-sided plan (oil content has only upper limits)", () => {
    const oil: BathLimits = {
      target: null,
      actionLow: null,
      actionHigh: 5,
      rejectLow: null,
      rejectHigh: 10,
    };
    expect(limitOrderProblems(oil)).toEqual([]);
    expect(evaluateReading(0, oil).state).toBe("ok");
    expect(evaluateReading(7, oil).state).toBe("action");
    expect(evaluateReading(11, oil).state).toBe("reject");
  });
  it("reports the worst value of a reading and names each finding", () => {
    const result = evaluateReadingValues(
      { concentrationPct: 3.7, ph: 13.2, temperatureC: 60 },
      {
        concentrationPct: plan,
        ph: { target: 11, actionLow: 10, actionHigh: 12, rejectLow: 9, rejectHigh: 13 },
      },
    );
    expect(result.state).toBe("reject");
    expect(result.findings).toEqual([
      "Detergent concentration 3.7 % is above the action limit 3.5 %",
      "pH 13.2 is above the reject limit 13",
    ]);
  });
  it("refuses limits in the wrong order, each beside its field", () => {
    expect(limitOrderProblems(plan)).toEqual([]);
    expect(limitOrderProblems({ ...plan, actionHigh: 4.5 }).map((p) => p.field)).toEqual([
      "rejectHigh",
    ]);
    expect(limitOrderProblems({ ...plan, rejectLow: 2.5 }).map((p) => p.field)).toEqual([
      "actionLow",
    ]);
    expect(limitOrderProblems({ ...plan, target: 5 }).map((p) => p.field)).toEqual(["actionHigh"]);
    // A gap (no action low) still compares the target with the reject low below it.
    expect(
      limitOrderProblems({ ...plan, actionLow: null, target: 1.5 }).map((p) => p.field),
    ).toEqual(["target"]);
    expect(
      limitOrderProblems({
        target: 3,
        actionLow: null,
        actionHigh: null,
        rejectLow: null,
        rejectHigh: null,
      }),
    ).toEqual([{ field: "actionLow", message: "Give at least one action or reject limit." }]);
  });
});

describe("bath age", () => {
  it("counts whole days since the last charge", () => {
    const now = new Date("2026-06-15T07:00:00Z");
    expect(bathAgeDays("2026-06-01T08:00:00Z", now)).toBe(13);
    expect(bathAgeDays("2026-06-15T06:00:00Z", now)).toBe(0);
    expect(bathAgeDays(null, now)).toBeNull();
  });
});
