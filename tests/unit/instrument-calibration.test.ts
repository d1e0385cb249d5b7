import { describe, expect, it } from "vitest";
import {
  addDays,
  calibrationSigningProblem,
  dueDateFrom,
  dueState,
  lastPassingCalibration,
  overdueSince,
  suspectRuns,
  type CalibrationEntry,
  type CitedInstrument,
} from "@/lib/instruments/calibration";

const balance = (dueOn: string | null, status: CitedInstrument["status"] = "in_service") =>
  ({
    kind: "balance",
    status,
    dueOn,
    assetNumber: "BAL-01",
    description: "Analytical balance",
  }) satisfies CitedInstrument;
const inks = (dueOn: string | null): CitedInstrument => ({
  kind: "test_ink_set",
  status: "in_service",
  dueOn,
  assetNumber: "INK-02",
  description: "Test inks 30–56 mN/m",
});

describe("the due date an interval gives", () => {
  it("is the same day of the month, the interval's months later", () => {
    // [derived] 2026-03-15 + 12 months = 2027-03-15; + 6 months = 2026-09-15.
    expect(dueDateFrom("2026-03-15", 12)).toBe("2027-03-15");
    expect(dueDateFrom("2026-03-15", 6)).toBe("2026-09-15");
    // [derived] crossing the year: 2026-11-20 + 3 months = 2027-02-20.
    expect(dueDateFrom("2026-11-20", 3)).toBe("2027-02-20");
  });
  it("falls on the month's last day when the month is shorter", () => {
    // [derived] Gregorian calendar: February 2027 has 28 days, February 2028 has 29.
    expect(dueDateFrom("2027-01-31", 1)).toBe("2027-02-28");
    expect(dueDateFrom("2028-01-31", 1)).toBe("2028-02-29");
    expect(dueDateFrom("2026-08-31", 1)).toBe("2026-09-30");
  });
  it("adds calendar days across a month end", () => {
    // [derived] 2026-11-30 + 1 day = 2026-12-01; 2026-12-31 − 30 days = 2026-12-01.
    expect(addDays("2026-11-30", 1)).toBe("2026-12-01");
    expect(addDays("2026-12-31", -30)).toBe("2026-12-01");
  });
});

describe("due and overdue", () => {
  // [practice] an instrument may be used on its due date and is overdue from the next day.
  it("is usable through its due date and overdue the day after", () => {
    expect(dueState(balance("2026-11-30"), "2026-11-30")).toBe("due_soon");
    expect(dueState(balance("2026-11-30"), "2026-12-01")).toBe("overdue");
    expect(overdueSince("2026-11-30")).toBe("2026-12-01");
  });
  it("shows as due within 30 days of the date, current before", () => {
    // [practice] a month's notice; [derived] 2026-12-31 − 30 days = 2026-12-01.
    expect(dueState(balance("2026-12-31"), "2026-11-30")).toBe("current");
    expect(dueState(balance("2026-12-31"), "2026-12-01")).toBe("due_soon");
  });
  it("counts a test-ink set by its expiry date", () => {
    expect(dueState(inks("2026-12-15"), "2026-12-15")).toBe("due_soon");
    expect(dueState(inks("2026-12-15"), "2026-12-16")).toBe("overdue");
  });
  it("tells an instrument never calibrated, and does not track a retired one", () => {
    expect(dueState(balance(null), "2026-12-01")).toBe("never_calibrated");
    expect(dueState(balance("2020-01-01", "retired"), "2026-12-01")).toBe("not_tracked");
  });
});

describe("the signing gate", () => {
  it("lets a run be signed while every instrument is within its date", () => {
    expect(
      calibrationSigningProblem([balance("2026-12-02"), inks("2027-03-01")], "2026-12-02"),
    ).toBe(null);
    expect(calibrationSigningProblem([], "2026-12-02")).toBe(null);
  });
  it("names an overdue instrument and since when", () => {
    const problem = calibrationSigningProblem([balance("2026-11-30")], "2026-12-02");
    expect(problem).toContain("Balance BAL-01 (Analytical balance)");
    expect(problem).toContain(
      "past its calibration due date (2026-11-30): overdue since 2026-12-01",
    );
  });
  it("names an expired test-ink set by its expiry", () => {
    const problem = calibrationSigningProblem([inks("2026-11-15")], "2026-12-02");
    expect(problem).toContain("Test-ink set INK-02");
    expect(problem).toContain("past its expiry date (2026-11-15): expired since 2026-11-16");
  });
  it("refuses an instrument with no calibration on record, and lists every problem", () => {
    const problem = calibrationSigningProblem([balance(null), inks("2026-11-15")], "2026-12-02");
    expect(problem).toContain("BAL-01 (Analytical balance) has no calibration on record");
    expect(problem).toContain("INK-02");
  });
});

describe("the runs an out-of-tolerance result puts in doubt", () => {
  const cals: CalibrationEntry[] = [
    { id: "a", calibratedOn: "2025-06-01", result: "pass" },
    { id: "b", calibratedOn: "2025-12-01", result: "adjusted" },
    { id: "c", calibratedOn: "2026-03-01", result: "out_of_tolerance" },
    { id: "d", calibratedOn: "2026-12-01", result: "out_of_tolerance" },
  ];
  it("starts at the last calibration found within tolerance", () => {
    // An adjusted instrument was within tolerance as found: it counts as passing.
    expect(lastPassingCalibration(cals, cals[3])?.id).toBe("b");
    expect(lastPassingCalibration(cals, cals[0])).toBe(null);
  });
  it("lists the runs from that day through the day it was found out", () => {
    const runs = [
      { id: "1", label: "TR-1", at: "2025-11-30" },
      { id: "2", label: "TR-2", at: "2025-12-01" },
      { id: "3", label: "TR-3", at: "2026-06-10T08:00:00.000Z" },
      { id: "4", label: "TR-4", at: "2026-12-01" },
      { id: "5", label: "TR-5", at: "2026-12-02" },
    ];
    expect(
      suspectRuns(runs, { calibratedOn: "2025-12-01" }, "2026-12-01").map((r) => r.label),
    ).toEqual(["TR-2", "TR-3", "TR-4"]);
    // With no passing calibration on record, every run up to the finding is suspect.
    expect(suspectRuns(runs, null, "2026-12-01").map((r) => r.label)).toEqual([
      "TR-1",
      "TR-2",
      "TR-3",
      "TR-4",
    ]);
  });
});
