import { describe, expect, it } from "vitest";
import { NC_STATUSES } from "@/db/enums";
import {
  containmentScope,
  lastPassingTest,
  type ProcessedItem,
} from "@/lib/nonconformances/containment";
import { closureProblem, transitionProblem, type NcFacts } from "@/lib/nonconformances/lifecycle";
import { nextNcNumber } from "@/lib/nonconformances/numbering";
import { reminderLevel } from "@/lib/nonconformances/reminders";

const ready: NcFacts = {
  undecidedItems: 0,
  heldWithoutDisposition: 0,
  hasRootCause: true,
  actions: 2,
  openActions: 0,
  hasEffectivenessPlan: true,
  effectiveness: "confirmed",
  hasEffectivenessEvidence: true,
};

describe("nonconformance lifecycle", () => {
  // Every pair of statuses: only the listed steps are allowed when the facts allow them.
  const ALLOWED = new Set([
    "open>contained",
    "contained>cause_found",
    "cause_found>actions_under_way",
    "actions_under_way>effectiveness_check",
    "effectiveness_check>closed",
    "open>cancelled",
    "contained>cancelled",
    "cause_found>cancelled",
    "actions_under_way>cancelled",
    "effectiveness_check>cancelled",
  ]);
  for (const from of NC_STATUSES)
    for (const to of NC_STATUSES) {
      const key = `${from}>${to}`;
      it(`${ALLOWED.has(key) ? "allows" : "refuses"} ${from} → ${to} when every requirement is met`, () => {
        // Back to actions is allowed only after a "not effective" result (tested below).
        expect(transitionProblem(from, to, ready) === null).toBe(ALLOWED.has(key));
      });
    }

  it("refuses each forward step until its requirement is met, saying what is missing", () => {
    expect(transitionProblem("open", "contained", { ...ready, undecidedItems: 2 })).toMatch(
      /held or released.*2 still undecided/,
    );
    expect(
      transitionProblem("contained", "cause_found", { ...ready, hasRootCause: false }),
    ).toMatch(/root cause/);
    expect(transitionProblem("cause_found", "actions_under_way", { ...ready, actions: 0 })).toMatch(
      /at least one/,
    );
    expect(
      transitionProblem("actions_under_way", "effectiveness_check", { ...ready, openActions: 1 }),
    ).toMatch(/1 is still open/);
    expect(
      transitionProblem("actions_under_way", "effectiveness_check", {
        ...ready,
        hasEffectivenessPlan: false,
      }),
    ).toMatch(/criterion and due date/);
  });

  it("closes only with every action done, every held item disposed and effectiveness confirmed with evidence", () => {
    expect(closureProblem(ready)).toBeNull();
    expect(closureProblem({ ...ready, openActions: 1 })).toMatch(/open actions/);
    expect(closureProblem({ ...ready, heldWithoutDisposition: 1 })).toMatch(/disposition/);
    expect(closureProblem({ ...ready, effectiveness: null })).toMatch(/effectiveness/);
    expect(closureProblem({ ...ready, hasEffectivenessEvidence: false })).toMatch(/evidence/);
  });

  it("goes back from the effectiveness check to actions only when the actions did not work", () => {
    expect(transitionProblem("effectiveness_check", "actions_under_way", ready)).toMatch(
      /did not work/,
    );
    expect(
      transitionProblem("effectiveness_check", "actions_under_way", {
        ...ready,
        effectiveness: "not_effective",
      }),
    ).toBeNull();
  });
});

describe("nonconformance numbers", () => {
  it("count up within the year without gaps, three digits wide", () => {
    expect(nextNcNumber(2026, null)).toEqual({ sequence: 1, number: "NC-2026-001" });
    expect(nextNcNumber(2026, 41)).toEqual({ sequence: 42, number: "NC-2026-042" });
    expect(nextNcNumber(2027, 999).number).toBe("NC-2027-1000");
  });
});

describe("containment", () => {
  const run = (id: string, at: string): ProcessedItem => ({
    kind: "run",
    id,
    label: id,
    lots: [],
    at,
  });
  const items = [
    run("r1", "2026-01-10"),
    run("r2", "2026-02-10"),
    run("r3", "2026-03-10"),
    run("r4", "2026-03-12"),
    {
      kind: "cycle" as const,
      id: "c1",
      label: "Cycle 7",
      lots: ["L-1", "L-2"],
      at: "2026-03-11T06:00:00Z",
    },
    run("r5", "2026-04-01"),
  ];

  it("bounds the suspect items by the last passing verified test before the failure", () => {
    const tests = [
      { id: "r1", at: "2026-01-10", outcome: "pass" as const },
      { id: "r2", at: "2026-02-10", outcome: "pass" as const },
      { id: "r3", at: "2026-03-10", outcome: "fail" as const },
      { id: "r5", at: "2026-04-01", outcome: "pass" as const },
    ];
    const last = lastPassingTest(tests, "2026-03-12");
    expect(last?.id).toBe("r2");
    // Raised on 2026-03-12 at 17:00: r5 did not exist yet; r2 itself passed and is not suspect.
    expect(containmentScope(items, last, "2026-03-12T17:00:00Z").map((i) => i.id)).toEqual([
      "r3",
      "c1",
      "r4",
    ]);
  });

  it("takes everything processed until the failure when no test ever passed", () => {
    expect(
      containmentScope(items, lastPassingTest([], "2026-03-12"), "2026-03-12T17:00:00Z").map(
        (i) => i.id,
      ),
    ).toEqual(["r1", "r2", "r3", "c1", "r4"]);
  });

  it("keeps a failed run recorded on the same day as the last pass (dates carry no time)", () => {
    const sameDay = [run("pass", "2025-11-18"), run("fail", "2025-11-18")];
    expect(
      containmentScope(sameDay, { id: "pass", at: "2025-11-18" }, "2025-11-18T17:00:00Z").map(
        (i) => i.id,
      ),
    ).toEqual(["fail"]);
  });

  it("keeps each wash cycle's lots with it", () => {
    const scope = containmentScope(items, { id: "r3", at: "2026-03-10" }, "2026-03-11T23:00:00Z");
    expect(scope).toEqual([items[4]]);
    expect(scope[0].lots).toEqual(["L-1", "L-2"]);
  });
});

describe("reminders", () => {
  it("remind two days before the due date and again once it has passed", () => {
    expect(reminderLevel("2026-04-10", "2026-04-07")).toBeNull();
    expect(reminderLevel("2026-04-10", "2026-04-08")).toBe("due");
    expect(reminderLevel("2026-04-10", "2026-04-10")).toBe("due");
    expect(reminderLevel("2026-04-10", "2026-04-11")).toBe("overdue");
  });
});
