import { describe, expect, it } from "vitest";
import {
  daysLeft,
  deviationState,
  expiryReason,
  judgeValue,
  nextDeviationNumber,
  reminderDue,
  stepProblem,
  temporaryRangeProblems,
} from "@/lib/deviations/rules";

const limits = { endsOn: "2026-12-10", maxLots: 5 };

describe("deviation expiry", () => {
  it("covers its end date whole and expires the day after [practice]", () => {
    expect(expiryReason(limits, "2026-12-10", 0)).toBeNull();
    expect(expiryReason(limits, "2026-12-11", 0)).toBe("end_date");
  });

  it("expires when the last permitted lot is used, before its end date", () => {
    expect(expiryReason(limits, "2026-12-01", 4)).toBeNull();
    expect(expiryReason(limits, "2026-12-01", 5)).toBe("lots_used");
    expect(expiryReason({ endsOn: null, maxLots: 2 }, "2030-01-01", 1)).toBeNull();
    expect(expiryReason({ endsOn: "2026-12-10", maxLots: null }, "2026-12-09", 999)).toBeNull();
  });

  it("computes the state on read: approved is active until a limit is reached", () => {
    expect(deviationState({ ...limits, status: "approved" }, "2026-12-05", 1)).toBe("active");
    expect(deviationState({ ...limits, status: "approved" }, "2026-12-11", 1)).toBe("expired");
    expect(deviationState({ ...limits, status: "draft" }, "2026-12-11", 0)).toBe("draft");
    expect(deviationState({ ...limits, status: "withdrawn" }, "2026-12-05", 0)).toBe("withdrawn");
    expect(deviationState({ ...limits, status: "expired" }, "2026-12-05", 0)).toBe("expired");
  });
});

describe("deviation steps", () => {
  it("allows each step only from its states", () => {
    expect(stepProblem("sign_authored", "draft")).toBeNull();
    expect(stepProblem("approve", "draft")).toBeNull();
    expect(stepProblem("withdraw", "draft")).toBeNull();
    expect(stepProblem("withdraw", "active")).toBeNull();
    expect(stepProblem("record_lot", "active")).toBeNull();
    expect(stepProblem("approve", "active")).toMatch(/active cannot be approved/);
    expect(stepProblem("record_lot", "draft")).toMatch(/draft cannot be used/);
    expect(stepProblem("withdraw", "withdrawn")).toMatch(/withdrawn cannot be withdrawn/);
    for (const step of ["sign_authored", "approve", "withdraw", "record_lot"] as const)
      expect(stepProblem(step, "expired")).toMatch(/has expired/);
  });
});

describe("reminders", () => {
  it("is due from N days before the end date through the last day, not after [practice: default 3 days]", () => {
    expect(daysLeft("2026-12-10", "2026-12-07")).toBe(3);
    expect(reminderDue("2026-12-10", 3, "2026-12-06")).toBe(false);
    expect(reminderDue("2026-12-10", 3, "2026-12-07")).toBe(true);
    expect(reminderDue("2026-12-10", 3, "2026-12-10")).toBe(true);
    expect(reminderDue("2026-12-10", 3, "2026-12-11")).toBe(false);
    expect(reminderDue(null, 3, "2026-12-10")).toBe(false);
  });
});

describe("temporary ranges", () => {
  const validated = { validatedLow: 2, validatedHigh: 4 };
  it("refuses no limit, an inverted range, and a range that permits nothing outside the validated one", () => {
    expect(
      temporaryRangeProblems({ ...validated, temporaryLow: null, temporaryHigh: null }),
    ).toHaveProperty("temporaryLow");
    expect(temporaryRangeProblems({ ...validated, temporaryLow: 5, temporaryHigh: 3 })).toEqual({
      temporaryHigh: "The high limit must not be below the low limit.",
    });
    expect(
      temporaryRangeProblems({ ...validated, temporaryLow: 2, temporaryHigh: 4 }).temporaryLow,
    ).toMatch(/inside the validated range/);
    expect(
      temporaryRangeProblems({ ...validated, temporaryLow: 2.5, temporaryHigh: 3.5 }).temporaryLow,
    ).toMatch(/inside the validated range/);
  });

  it("takes a range that reaches beyond the validated one on either side", () => {
    expect(temporaryRangeProblems({ ...validated, temporaryLow: 2, temporaryHigh: 5 })).toEqual({});
    expect(temporaryRangeProblems({ ...validated, temporaryLow: 1, temporaryHigh: null })).toEqual(
      {},
    );
    expect(
      temporaryRangeProblems({
        validatedLow: null,
        validatedHigh: 4,
        temporaryLow: null,
        temporaryHigh: 6,
      }),
    ).toEqual({});
  });

  it("judges a value against the validated range first, then the active deviation's", () => {
    const v = { low: 2, high: 4 };
    expect(judgeValue(3, v, { low: 2, high: 5 })).toBe("within_validated");
    expect(judgeValue(4.5, v, { low: 2, high: 5 })).toBe("within_temporary");
    expect(judgeValue(5.5, v, { low: 2, high: 5 })).toBe("outside");
    expect(judgeValue(4.5, v, null)).toBe("outside");
  });
});

describe("numbering", () => {
  it("numbers DV-YYYY-NNN after the year's highest, restarting each year", () => {
    expect(nextDeviationNumber(2026, [])).toBe("DV-2026-001");
    expect(nextDeviationNumber(2026, ["DV-2026-001", "DV-2026-007", "DV-2025-020"])).toBe(
      "DV-2026-008",
    );
  });
});
