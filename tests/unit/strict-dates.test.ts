import { describe, expect, it } from "vitest";
import { auditEventsQuery } from "@/lib/schemas/api";
import { auditQuerySchema } from "@/lib/schemas/audit";
import {
  calendarDateProblem,
  calendarDateSchema,
  calendarDateTimeProblem,
  daysInMonth,
} from "@/lib/schemas/date";
import { approveSchema, submitSchema } from "@/lib/schemas/document";
import { bathRecordSchema, createRunSchema } from "@/lib/schemas/evidence";
import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";

const issue = (
  r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } },
  field: string,
) => (r.success ? null : (r.error!.issues.find((i) => i.path[0] === field)?.message ?? null));

describe("one calendar-date rule", () => {
  it("refuses 2026-13-45 and 30 February, never rolling them over", () => {
    expect(calendarDateProblem("2026-13-45")).toBe(
      "There is no month 13: months run from 01 to 12.",
    );
    expect(calendarDateProblem("2026-02-30")).toBe("There is no such day: 2026-02-30.");
    expect(calendarDateSchema.safeParse("2026-02-30").success).toBe(false);
    expect(calendarDateSchema.parse(" 2026-03-02 ")).toBe("2026-03-02");
  });

  it("follows the Gregorian leap-year rule (ISO 8601-1:2019 uses the Gregorian calendar) [std]", () => {
    expect(daysInMonth(2024, 2)).toBe(29); // divisible by 4
    expect(daysInMonth(2026, 2)).toBe(28);
    expect(daysInMonth(2100, 2)).toBe(28); // century, not divisible by 400
    expect(daysInMonth(2000, 2)).toBe(29); // divisible by 400
    expect(calendarDateProblem("2024-02-29")).toBeNull();
    expect(calendarDateProblem("2100-02-29")).toBe("There is no such day: 2100-02-29.");
    expect(calendarDateProblem("2026-04-31")).toBe("There is no such day: 2026-04-31.");
    expect(calendarDateProblem("2026-12-31")).toBeNull();
    expect(calendarDateProblem("2026-00-10")).toMatch(/no month 00/);
    expect(calendarDateProblem("2026-01-00")).toMatch(/no such day/);
  });

  it("refuses other shapes and implausible years", () => {
    for (const text of ["2026-1-5", "05.01.2026", "2026-01-05T10:00", "20260105", ""])
      expect(calendarDateProblem(text)).not.toBeNull();
    expect(calendarDateProblem("0000-01-01")).toBe("Enter a year from 1900 to 2999.");
  });

  it("checks a time of day when one is given", () => {
    expect(calendarDateTimeProblem("2026-03-01T23:59")).toBeNull();
    expect(calendarDateTimeProblem("2026-03-01")).toBeNull();
    expect(calendarDateTimeProblem("2026-03-01T24:00")).toBe("There is no such time: 24:00.");
    expect(calendarDateTimeProblem("2026-02-30T10:00")).toBe("There is no such day: 2026-02-30.");
  });
});

describe("every entered date uses it", () => {
  const hash = "a".repeat(64);
  const uuid = "00000000-0000-4000-8000-000000000000";

  it("a document's effective date and review due date", () => {
    const approve = (effectiveDate: string) =>
      approveSchema.safeParse({ versionId: uuid, contentHash: hash, password: "x", effectiveDate });
    expect(issue(approve("2026-13-45"), "effectiveDate")).toMatch(/no month 13/);
    expect(issue(approve("2026-02-30"), "effectiveDate")).toMatch(/no such day/);
    expect(approve("2026-02-28").success).toBe(true);
    const submit = (dueDate: string) =>
      submitSchema.safeParse({
        versionId: uuid,
        lockVersion: 0,
        contentHash: hash,
        reviewerIds: ["11111111-1111-4111-8111-111111111111"],
        approverId: uuid,
        routing: "sequence",
        dueDate,
        password: "x",
      });
    expect(issue(submit("2026-02-30"), "dueDate")).toMatch(/no such day/);
    expect(submit("").success).toBe(true);
  });

  it("a test run's date and a bath record's time", () => {
    const run = createRunSchema.safeParse({
      partFamilyId: uuid,
      recipeVersionId: uuid,
      testType: "gravimetric",
      technicianId: uuid,
      lab: "Lab 2",
      performedOn: "2026-02-30",
    });
    expect(issue(run, "performedOn")).toMatch(/no such day/);
    const bath = bathRecordSchema.safeParse({
      stageId: uuid,
      kind: "bath_change",
      performedAt: "2026-13-01T10:00",
    });
    expect(issue(bath, "performedAt")).toMatch(/no month 13/);
  });

  it("list and API filters", () => {
    expect(issue(evidenceListQuerySchema.safeParse({ from: "2026-02-30" }), "from")).toMatch(
      /no such day/,
    );
    expect(issue(auditQuerySchema.safeParse({ from: "", to: "2026-13-45" }), "to")).toMatch(
      /no month 13/,
    );
    expect(auditQuerySchema.safeParse({ from: "", to: "" }).success).toBe(true);
    expect(issue(auditEventsQuery.safeParse({ from: "2026-02-29" }), "from")).toMatch(
      /no such day/,
    );
  });
});
