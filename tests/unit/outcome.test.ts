import { describe, expect, it } from "vitest";
import {
  computeRunOutcome,
  type Check,
  type OutcomeInput,
  type SampleOutcome,
} from "@/lib/evidence/outcome";
import { combineOutcome } from "@/lib/evidence/outcomes/common";

const SPEC = {
  ccc: "A(E8)",
  maxMetallicUm: null,
  maxNonMetallicUm: null,
  maxFibreUm: null,
  gravimetricLimitMg: 1,
  gravimetricBasis: "per_component" as const,
  minWettingTensionMNm: null,
};
const base: OutcomeInput = {
  testType: "gravimetric",
  family: { wettedAreaCm2: 10, wettedVolumeCm3: null },
  spec: SPEC,
  conductivityLimitUsPerCm: null,
  samples: [],
  runData: null,
  photoCount: 0,
};
const passed: SampleOutcome = { sampleLabel: "S", worstCase: false, outcome: "pass", lines: [] };
const check = (kind: Check["kind"], pass: boolean | null): Check => ({
  kind,
  title: "Any title at all",
  pass,
  lines: [],
});

describe("combining a run's outcome", () => {
  it("decides by what a check is, not by its title", () => {
    expect(combineOutcome([passed], [check("measurement", false)], [])).toBe("incomplete");
    expect(combineOutcome([passed], [check("acceptance", false)], [])).toBe("fail");
    expect(combineOutcome([passed], [check("acceptance", null)], [])).toBe("incomplete");
    expect(
      combineOutcome([passed], [check("measurement", true), check("acceptance", true)], []),
    ).toBe("pass");
  });

  it("is incomplete with no samples or anything missing, and a missing item outweighs a failure", () => {
    expect(combineOutcome([], [], [])).toBe("incomplete");
    expect(combineOutcome([{ ...passed, outcome: "fail" }], [], ["No limit"])).toBe("incomplete");
    expect(combineOutcome([passed, { ...passed, outcome: "fail" }], [], [])).toBe("fail");
  });
});

describe("computeRunOutcome", () => {
  it("says first that no sample is recorded", () => {
    const out = computeRunOutcome({ ...base, spec: { ...SPEC, gravimetricLimitMg: null } });
    expect(out.outcome).toBe("incomplete");
    expect(out.missing).toEqual([
      "No sample recorded yet.",
      "The specification sets no gravimetric limit.",
    ]);
  });

  it("sends each test type to its own evaluation", () => {
    // 1.2 mg over 2 parts = 0.6 mg each ≤ 1 mg; the residue itself is above the practical lower limit of about 1 mg (below it: not qualified, never a pass) [std, ISO 16232 gravimetry]
    const data = { filterBeforeMg: 100, filterAfterMg: 101.2, components: 2 };
    expect(
      computeRunOutcome({ ...base, samples: [{ sampleLabel: "G", worstCase: false, data }] })
        .outcome,
    ).toBe("pass");
    const visual = computeRunOutcome({
      ...base,
      testType: "visual",
      samples: [{ sampleLabel: "V", worstCase: false, data: { acceptable: true } }],
      photoCount: 1,
    });
    expect(visual.checks.map((c) => c.title)).toEqual(["Photos"]);
  });

  it("leaves a run of a test type it does not know incomplete, saying so", () => {
    const out = computeRunOutcome({
      ...base,
      testType: "salt_spray" as never,
      samples: [{ sampleLabel: "X", worstCase: false, data: {} }],
    });
    expect(out.outcome).toBe("incomplete");
    expect(out.missing).toEqual(['No evaluation is defined for the test type "salt_spray".']);
  });

  it("makes the run incomplete, with the reason, when a computation refuses stored values", () => {
    const out = computeRunOutcome({
      ...base,
      samples: [
        {
          sampleLabel: "G",
          worstCase: false,
          data: { filterBeforeMg: 100, filterAfterMg: 99, components: 1 },
        },
      ],
    });
    expect(out.outcome).toBe("incomplete");
    expect(out.samples).toEqual([]);
    expect(out.missing[0]).toMatch(/lighter after filtration/);
  });
});
