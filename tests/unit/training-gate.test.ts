import { describe, expect, it } from "vitest";
import { addMonths, reminderDue, trainingGateProblems, trainingState } from "@/lib/training/rules";

const EX = { code: "EX-01", version: 2, name: "Pressure rinsing, valve bodies" };
const GR = { code: "GR-01", version: 1, name: "Residue weighing" };

describe("addMonths", () => {
  it("adds calendar months, keeping the day", () => {
    // 24 months after 2026-12-03 is 2028-12-03 [derived: calendar arithmetic]
    expect(addMonths("2026-12-03", 24)).toBe("2028-12-03");
    expect(addMonths("2026-11-15", 2)).toBe("2027-01-15");
  });
  it("takes the month's last day when the day does not exist", () => {
    // 2028 is a leap year (divisible by 4, not by 100) [derived: Gregorian rule]
    expect(addMonths("2026-01-31", 1)).toBe("2026-02-28");
    expect(addMonths("2028-01-31", 1)).toBe("2028-02-29");
    expect(addMonths("2028-02-29", 12)).toBe("2029-02-28");
  });
});

describe("trainingState at the expiry boundaries", () => {
  // Current before the expiry date, lapsed from it; "expires soon" within 30 days [practice].
  it("is lapsed on the expiry day itself and after", () => {
    expect(trainingState("2026-12-03", "2026-12-03")).toBe("lapsed");
    expect(trainingState("2026-12-03", "2026-12-04")).toBe("lapsed");
  });
  it("is current the day before expiry only as 'expires soon'", () => {
    expect(trainingState("2026-12-03", "2026-12-02")).toBe("expires_soon");
  });
  it("switches from current to expires soon exactly 30 days ahead", () => {
    expect(trainingState("2027-01-02", "2026-12-03")).toBe("expires_soon"); // 30 days [derived]
    expect(trainingState("2027-01-03", "2026-12-03")).toBe("current"); // 31 days [derived]
  });
  it("is never without a record", () => {
    expect(trainingState(null, "2026-12-03")).toBe("never");
  });
});

describe("trainingGateProblems (signing performed)", () => {
  it("lets a person with current training on every cited method sign", () => {
    expect(
      trainingGateProblems([EX], [{ methodCode: "EX-01", expiresOn: "2027-06-01" }], "2026-12-03"),
    ).toEqual([]);
  });
  it("refuses on the expiry day, naming the method and when the training lapsed", () => {
    const problems = trainingGateProblems(
      [EX],
      [{ methodCode: "EX-01", expiresOn: "2026-12-03" }],
      "2026-12-03",
    );
    expect(problems).toEqual([
      "Your training on EX-01 v2 Pressure rinsing, valve bodies lapsed on 2026-12-03: a trainer signs off your retraining first.",
    ]);
  });
  it("lets the last day before expiry through", () => {
    expect(
      trainingGateProblems([EX], [{ methodCode: "EX-01", expiresOn: "2026-12-04" }], "2026-12-03"),
    ).toEqual([]);
  });
  it("refuses a method never trained on", () => {
    expect(trainingGateProblems([GR], [], "2026-12-03")[0]).toMatch(
      /no training on GR-01 v1 Residue weighing/,
    );
  });
  it("counts the newest sign-off: a retraining replaces a lapsed one", () => {
    expect(
      trainingGateProblems(
        [EX],
        [
          { methodCode: "EX-01", expiresOn: "2025-01-01" },
          { methodCode: "EX-01", expiresOn: "2028-12-03" },
        ],
        "2026-12-03",
      ),
    ).toEqual([]);
  });
  it("names each cited method that fails, and only those", () => {
    const problems = trainingGateProblems(
      [EX, GR],
      [
        { methodCode: "EX-01", expiresOn: "2028-01-01" },
        { methodCode: "GR-01", expiresOn: "2026-10-30" },
      ],
      "2026-12-03",
    );
    expect(problems).toHaveLength(1);
    expect(problems[0]).toContain("GR-01 v1");
    expect(problems[0]).toContain("lapsed on 2026-10-30");
  });
  it("asks nothing of a run that cites no method", () => {
    expect(trainingGateProblems([], [], "2026-12-03")).toEqual([]);
  });
});

describe("reminderDue (once per expiry date)", () => {
  it("is due within 30 days of expiry, not before", () => {
    expect(reminderDue("2027-01-02", null, "2026-12-03")).toBe(true);
    expect(reminderDue("2027-01-03", null, "2026-12-03")).toBe(false);
  });
  it("is not sent twice for the same expiry date, but again for a new one", () => {
    expect(reminderDue("2027-01-02", "2027-01-02", "2026-12-03")).toBe(false);
    expect(reminderDue("2027-01-02", "2025-01-02", "2026-12-03")).toBe(true);
  });
});
