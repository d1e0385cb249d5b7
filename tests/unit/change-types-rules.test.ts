import { describe, expect, it } from "vitest";
import {
  addDays,
  approvalDueProblem,
  emergencyApprovalState,
  needsEscalation,
  showsEmergency,
} from "@/lib/changes/emergency";
import { evaluateEffectiveness, type EffectivenessRun } from "@/lib/changes/effectiveness";
import {
  affectedDocumentsMissing,
  revisionSince,
  type AffectedDocumentVersion,
} from "@/lib/changes/affected-documents";
import { evaluateCustomerApproval } from "@/lib/changes/customer-approval";

// Rules from issue #13 items 3, 5 and 6; the default of 3 days and 3 runs is the issue's.
describe("emergency approval deadline", () => {
  it("counts calendar days across a month and a leap day", () => {
    expect(addDays("2026-01-30", 3)).toBe("2026-02-02");
    expect(addDays("2028-02-27", 3)).toBe("2028-03-01");
  });

  it("refuses a deadline in the past or beyond the plant's setting, takes today and the last day", () => {
    expect(approvalDueProblem("2026-12-01", "2026-12-02", 3)).toMatch(/cannot be in the past/);
    expect(approvalDueProblem("2026-12-06", "2026-12-02", 3)).toMatch(
      /within 3 days: set 2026-12-05 or earlier/,
    );
    expect(approvalDueProblem("2026-12-02", "2026-12-02", 3)).toBeNull();
    expect(approvalDueProblem("2026-12-05", "2026-12-02", 3)).toBeNull();
  });

  it("is awaiting through its due date and overdue from the next day", () => {
    const base = { status: "impact_assessed" as const, approvalDueOn: "2026-12-05" };
    expect(emergencyApprovalState({ ...base, today: "2026-12-04" })).toBe("awaiting");
    expect(emergencyApprovalState({ ...base, today: "2026-12-05" })).toBe("awaiting");
    expect(emergencyApprovalState({ ...base, today: "2026-12-06" })).toBe("overdue");
  });

  it("stops the clock once approved, rejected or withdrawn", () => {
    const late = { approvalDueOn: "2026-12-05", today: "2026-12-20" };
    expect(emergencyApprovalState({ ...late, status: "approved_for_implementation" })).toBe(
      "approved",
    );
    expect(emergencyApprovalState({ ...late, status: "requalification" })).toBe("approved");
    expect(emergencyApprovalState({ ...late, status: "rejected" })).toBe("ended");
    expect(emergencyApprovalState({ ...late, status: "withdrawn" })).toBe("ended");
  });

  it("escalates an overdue approval once, and never one still awaiting or approved", () => {
    const overdue = {
      status: "impact_assessed" as const,
      approvalDueOn: "2026-12-05",
      today: "2026-12-06",
    };
    expect(needsEscalation({ ...overdue, escalatedAt: null })).toBe(true);
    expect(needsEscalation({ ...overdue, escalatedAt: "2026-12-06T00:10:00.000Z" })).toBe(false);
    expect(needsEscalation({ ...overdue, today: "2026-12-05", escalatedAt: null })).toBe(false);
    expect(
      needsEscalation({ ...overdue, status: "approved_for_implementation", escalatedAt: null }),
    ).toBe(false);
  });

  it("shows the word Emergency until the change is closed or ended", () => {
    expect(showsEmergency("impact_assessed")).toBe(true);
    expect(showsEmergency("verified")).toBe(true);
    expect(showsEmergency("closed")).toBe(false);
    expect(showsEmergency("rejected")).toBe(false);
  });
});

describe("effectiveness check after a change", () => {
  const run = (n: number, outcome: EffectivenessRun["outcome"], day: number): EffectivenessRun => ({
    number: `TR-2026-${String(n).padStart(3, "0")}`,
    outcome,
    verifiedAt: `2026-12-${String(day).padStart(2, "0")}T08:00:00.000Z`,
  });

  it("is pending with no run, and counts k of N as passing runs arrive", () => {
    expect(evaluateEffectiveness(3, [])).toMatchObject({
      state: "pending",
      passed: 0,
      required: 3,
    });
    expect(evaluateEffectiveness(3, [run(1, "pass", 3), run(2, "pass", 4)])).toMatchObject({
      state: "pending",
      passed: 2,
    });
  });

  it("is confirmed by N passing runs, and a later failure does not undo it", () => {
    const r = evaluateEffectiveness(3, [
      run(4, "fail", 9),
      run(1, "pass", 3),
      run(2, "pass", 4),
      run(3, "pass", 5),
    ]);
    expect(r).toMatchObject({ state: "confirmed", passed: 3, failedRun: null });
    expect(r.counted).toEqual(["TR-2026-001", "TR-2026-002", "TR-2026-003"]);
  });

  it("fails at the first counted run that does not pass, an incomplete one included", () => {
    expect(
      evaluateEffectiveness(3, [run(1, "pass", 3), run(2, "fail", 4), run(3, "pass", 5)]),
    ).toMatchObject({ state: "failed", passed: 1, failedRun: "TR-2026-002" });
    expect(evaluateEffectiveness(3, [run(7, "incomplete", 3)])).toMatchObject({
      state: "failed",
      failedRun: "TR-2026-007",
    });
  });

  it("orders by verification time, not by run number", () => {
    expect(evaluateEffectiveness(1, [run(1, "fail", 8), run(2, "pass", 3)])).toMatchObject({
      state: "confirmed",
      counted: ["TR-2026-002"],
    });
  });
});

describe("affected documents before closure", () => {
  const opened = "2026-11-10T09:00:00.000Z";
  const v = (
    version: number,
    status: AffectedDocumentVersion["status"],
    createdAt: string,
    effectiveDate: string | null,
  ): AffectedDocumentVersion => ({ version, status, createdAt, effectiveDate });

  it("counts only a version made after the change opened and put in force", () => {
    expect(
      revisionSince([v(1, "effective", "2025-01-01T00:00:00.000Z", "2025-01-05")], opened),
    ).toBeNull();
    expect(revisionSince([v(2, "approved", "2026-11-12T00:00:00.000Z", null)], opened)).toBeNull();
    expect(revisionSince([v(2, "draft", "2026-11-12T00:00:00.000Z", null)], opened)).toBeNull();
    expect(
      revisionSince([v(2, "effective", "2026-11-12T00:00:00.000Z", "2026-11-20")], opened),
    ).toMatchObject({ version: 2 });
    expect(
      revisionSince(
        [
          v(3, "effective", "2026-11-25T00:00:00.000Z", "2026-11-28"),
          v(2, "superseded", "2026-11-12T00:00:00.000Z", "2026-11-20"),
        ],
        opened,
      ),
    ).toMatchObject({ version: 2 });
  });

  it("refuses closure naming each document neither revised nor confirmed unaffected", () => {
    const missing = affectedDocumentsMissing([
      {
        number: "WI-AW3-01",
        title: "Loading the baskets",
        revisedBy: null,
        unaffectedReason: null,
      },
      {
        number: "PQ-AW3-VB",
        title: "PQ protocol",
        revisedBy: v(2, "effective", "2026-11-12T00:00:00.000Z", "2026-11-20"),
        unaffectedReason: null,
      },
      {
        number: "CP-AW3",
        title: "Control plan",
        revisedBy: null,
        unaffectedReason: "Temperature limits are quoted by reference to the recipe, not copied.",
      },
      {
        number: "PFMEA-3",
        title: "Process risk analysis",
        revisedBy: null,
        unaffectedReason: "  ",
      },
    ]);
    expect(missing).toHaveLength(2);
    expect(missing[0]).toMatch(/^WI-AW3-01 Loading the baskets: /);
    expect(missing[1]).toMatch(/^PFMEA-3 /);
    expect(affectedDocumentsMissing([])).toEqual([]);
  });
});

describe("customer approval gate", () => {
  const spec = (id: string, asks: boolean) => ({
    id,
    label: `SPEC-${id} rev 1 (Norrland Hydraulics)`,
    customerApprovesChanges: asks,
  });
  const decision = (specId: string, d: "approved" | "rejected", recordedAt: string) => ({
    specId,
    decision: d,
    decidedOn: recordedAt.split("T")[0],
    reference: `NH-${specId}`,
    recordedAt,
  });

  it("asks nothing of a minor change, nor of a specification that does not require it", () => {
    expect(evaluateCustomerApproval("minor", [spec("A", true)], [])).toMatchObject({
      required: false,
      holds: true,
    });
    expect(evaluateCustomerApproval("major", [spec("B", false)], [])).toMatchObject({
      required: false,
      holds: true,
    });
  });

  it("holds a major change until each asking specification has the customer's approval", () => {
    const specs = [spec("A", true), spec("B", true), spec("C", false)];
    const none = evaluateCustomerApproval("major", specs, []);
    expect(none).toMatchObject({ required: true, holds: false });
    expect(none.missing).toEqual([
      "SPEC-A rev 1 (Norrland Hydraulics): the customer's decision is not recorded",
      "SPEC-B rev 1 (Norrland Hydraulics): the customer's decision is not recorded",
    ]);
    const one = evaluateCustomerApproval("major", specs, [
      decision("A", "approved", "2026-11-20T10:00:00.000Z"),
    ]);
    expect(one.missing).toHaveLength(1);
    expect(
      evaluateCustomerApproval("major", specs, [
        decision("A", "approved", "2026-11-20T10:00:00.000Z"),
        decision("B", "approved", "2026-11-21T10:00:00.000Z"),
      ]).holds,
    ).toBe(true);
  });

  it("blocks on a rejection with a plain message, and the latest decision counts", () => {
    const rejected = evaluateCustomerApproval(
      "major",
      [spec("A", true)],
      [decision("A", "rejected", "2026-11-20T10:00:00.000Z")],
    );
    expect(rejected.holds).toBe(false);
    expect(rejected.missing[0]).toBe(
      "SPEC-A rev 1 (Norrland Hydraulics): the customer rejected this change on 2026-11-20 (NH-A)",
    );
    expect(
      evaluateCustomerApproval(
        "major",
        [spec("A", true)],
        [
          decision("A", "approved", "2026-11-25T10:00:00.000Z"),
          decision("A", "rejected", "2026-11-20T10:00:00.000Z"),
        ],
      ).holds,
    ).toBe(true);
  });
});
