import { describe, expect, it } from "vitest";
import { CHANGE_STATUSES } from "@/db/enums";
import {
  CHANGE_STEPS,
  stepOffered,
  stepProblem,
  waitingFor,
  type ChangeStep,
} from "@/lib/changes/workflow";
import { evaluateGate, type GateRequirement, type GateRun } from "@/lib/changes/gate";

const particle: GateRequirement = { id: "r1", testType: "particle_cleanliness", samples: 29 };
const gravimetric: GateRequirement = { id: "r2", testType: "gravimetric", samples: 29 };

const good = (over: Partial<GateRun> = {}): GateRun => ({
  number: "TR-1",
  testType: "particle_cleanliness",
  outcome: "pass",
  status: "verified",
  sampleCount: 29,
  performedBy: ["tech"],
  verifiedBy: ["eng"],
  ...over,
});

describe("requalification gate", () => {
  it("holds when every requirement has a passing, large enough run verified by a second person", () => {
    const g = evaluateGate(
      [particle, gravimetric],
      new Map([
        ["r1", [good()]],
        ["r2", [good({ number: "TR-2", testType: "gravimetric", sampleCount: 30 })]],
      ]),
    );
    expect(g).toMatchObject({ holds: true, missing: [] });
    expect(g.requirements.map((r) => r.satisfiedBy)).toEqual(["TR-1", "TR-2"]);
  });

  it("holds trivially with no requirements (a minor change)", () => {
    expect(evaluateGate([], new Map()).holds).toBe(true);
  });

  const refusals: { name: string; runs: GateRun[]; missing: string }[] = [
    {
      name: "no run linked",
      runs: [],
      missing: "Particle cleanliness (29 samples): no test run linked",
    },
    {
      name: "a failing outcome",
      runs: [good({ outcome: "fail" })],
      missing: "TR-1 computed outcome is fail, not pass",
    },
    {
      name: "an outcome not yet computed",
      runs: [good({ outcome: null })],
      missing: "TR-1 computed outcome is not yet computed, not pass",
    },
    {
      name: "an incomplete outcome",
      runs: [good({ outcome: "incomplete" })],
      missing: "TR-1 computed outcome is incomplete, not pass",
    },
    {
      name: "too few samples",
      runs: [good({ sampleCount: 28 })],
      missing: "TR-1 has 28 samples, 29 required",
    },
    {
      name: "performed but not verified",
      runs: [good({ status: "performed", verifiedBy: [] })],
      missing: "TR-1 is not verified by a second person",
    },
    {
      name: "verified by the performer only",
      runs: [good({ verifiedBy: ["tech"] })],
      missing: "TR-1 is not verified by a second person",
    },
    {
      name: "the wrong test type",
      runs: [good({ testType: "visual" })],
      missing: "TR-1 is a visual (stains) test, not particle cleanliness",
    },
    {
      name: "a superseded revision",
      runs: [good({ status: "superseded" })],
      missing: "TR-1 was superseded by a later revision",
    },
  ];
  it.each(refusals)("refuses with $name and says exactly that", ({ runs, missing }) => {
    const g = evaluateGate(
      [particle, gravimetric],
      new Map([
        ["r1", runs],
        ["r2", [good({ number: "TR-2", testType: "gravimetric" })]],
      ]),
    );
    expect(g.holds).toBe(false);
    expect(g.missing).toHaveLength(1);
    expect(g.missing[0]).toContain(missing);
  });

  it("any one good run among several satisfies a requirement", () => {
    const g = evaluateGate(
      [particle],
      new Map([["r1", [good({ outcome: "fail" }), good({ number: "TR-3" })]]]),
    );
    expect(g.requirements[0].satisfiedBy).toBe("TR-3");
  });
});

describe("change-request lifecycle", () => {
  const allowed: Record<ChangeStep, string[]> = {
    assess: ["draft"],
    reopen: ["impact_assessed"],
    approve: ["impact_assessed"],
    start_requalification: ["approved_for_implementation"],
    verify: ["approved_for_implementation", "requalification"],
    close: ["verified"],
    reject: [
      "draft",
      "impact_assessed",
      "approved_for_implementation",
      "requalification",
      "verified",
    ],
    withdraw: [
      "draft",
      "impact_assessed",
      "approved_for_implementation",
      "requalification",
      "verified",
    ],
  };
  for (const step of Object.keys(CHANGE_STEPS) as ChangeStep[]) {
    for (const status of CHANGE_STATUSES) {
      const may = allowed[step].includes(status);
      it(`${step} from ${status}: ${may ? "allowed" : "refused"}`, () => {
        // With no tests, "start requalification" is refused even from its own status.
        const tests = step === "start_requalification" ? 2 : 0;
        expect(stepProblem(step, status, tests) === null).toBe(may);
      });
    }
  }
  it("a change with tests goes through requalification; one without skips it", () => {
    expect(stepProblem("verify", "approved_for_implementation", 2)).toMatch(
      /Start requalification first/,
    );
    expect(stepProblem("start_requalification", "approved_for_implementation", 0)).toMatch(
      /no requalification tests/,
    );
    expect(stepProblem("close", "requalification", 2)).toBe(
      "Verify the change first: a second person signs it verified, and only then is it closed and made effective.",
    );
  });
});

describe("what the change page offers during requalification", () => {
  const missing = ["Particle cleanliness (29 samples): no test run linked"];
  it("offers neither Verify nor Close before the evidence exists, and says what is missing", () => {
    expect(stepOffered("verify", "requalification", 2, false)).toBe(false);
    expect(stepOffered("close", "requalification", 2, false)).toBe(false);
    expect(waitingFor("requalification", 2, { holds: false, missing })).toEqual({
      summary:
        "Verify and Close and make effective wait for the requalification evidence. Still missing:",
      missing,
    });
  });
  it("offers Verify once the gate holds, and Close only after the change is verified", () => {
    expect(stepOffered("verify", "requalification", 2, true)).toBe(true);
    expect(stepOffered("close", "requalification", 2, true)).toBe(false);
    expect(waitingFor("requalification", 2, { holds: true, missing: [] })?.summary).toMatch(
      /only then is it closed/,
    );
    expect(stepOffered("close", "verified", 2, true)).toBe(true);
  });
  it("a change without tests is verified straight after approval; nothing waits", () => {
    expect(stepOffered("verify", "approved_for_implementation", 0, true)).toBe(true);
    expect(waitingFor("approved_for_implementation", 0, { holds: true, missing: [] })).toBeNull();
  });
});

describe("requalification gate: independent samples from distinct wash cycles", () => {
  const fromCycles: GateRequirement = { ...particle, samples: 3, cycles: 3 };
  const run = (sampleCount: number, cycleCount: number) => good({ sampleCount, cycleCount });

  it("says which is missing when the parts came from too few cycles", () => {
    const g = evaluateGate([fromCycles], new Map([["r1", [run(3, 1)]]]));
    expect(g.holds).toBe(false);
    expect(g.missing).toEqual([
      "Particle cleanliness (3 samples): TR-1 has 3 parts from 1 cycle; needs 3 cycles",
    ]);
  });

  it("counts parts and cycles apart: enough cycles but too few parts names only the parts", () => {
    const g = evaluateGate([{ ...fromCycles, samples: 29 }], new Map([["r1", [run(5, 3)]]]));
    expect(g.missing).toEqual([
      "Particle cleanliness (29 samples): TR-1 has 5 samples, 29 required",
    ]);
  });

  it("holds at exactly the cycles asked for, and counts a run naming no cycle as none", () => {
    expect(evaluateGate([fromCycles], new Map([["r1", [run(3, 3)]]])).holds).toBe(true);
    expect(
      evaluateGate([fromCycles], new Map([["r1", [good({ sampleCount: 3 })]]])).missing,
    ).toEqual(["Particle cleanliness (3 samples): TR-1 has 3 parts from 0 cycles; needs 3 cycles"]);
  });

  it("leaves cycles uncounted on a requirement set before they were counted", () => {
    expect(evaluateGate([{ ...particle, cycles: null }], new Map([["r1", [good()]]])).holds).toBe(
      true,
    );
  });
});
