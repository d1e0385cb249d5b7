import { describe, expect, it } from "vitest";
import {
  WETTING_METHOD_NOTE,
  wettingTensionOutcome,
} from "@/lib/evidence/outcomes/wetting-tension";
import { wettingSampleSchema } from "@/lib/schemas/evidence";

const SPEC = {
  ccc: "A(E8)",
  maxMetallicUm: null,
  maxNonMetallicUm: null,
  maxFibreUm: null,
  gravimetricLimitMg: null,
  gravimetricBasis: null,
  minWettingTensionMNm: 36,
};
const sample = (readings: string) => ({
  sampleLabel: "W-1",
  worstCase: false,
  data: wettingSampleSchema.parse({ sampleLabel: "W-1", readingsMNm: readings }),
});

describe("wetting tension outcome", () => {
  it("passes when the lowest reading, as measured, meets the minimum, and says the method is adapted", () => {
    // [practice] lowest 36.2 ≥ 36
    const out = wettingTensionOutcome({ spec: SPEC, samples: [sample("38, 36.2, 37")] });
    expect(out.samples[0].lines[0]).toBe("Readings 38, 36.2, 37 mN/m");
    expect(out.outcome).toBe("pass");
    // ISO 8296 / ASTM D2578 are written for plastic film [std, scope]: the report says it is adapted
    expect(out.samples[0].lines).toContain(WETTING_METHOD_NOTE);
    expect(WETTING_METHOD_NOTE).toMatch(/written for plastic film and adapted/);
  });

  it("fails when one spot wets below the minimum, even by less than half a unit", () => {
    // [practice] lowest 35.7 < 36; rounding it to the nearest 0.5 (36.0 would be ≥ 36) would pass a failed spot
    const out = wettingTensionOutcome({ spec: SPEC, samples: [sample("38, 35.8")] });
    expect(out.outcome).toBe("fail");
    expect(out.samples[0].lines[1]).toBe(
      "35.8 mN/m (lowest of 2, as measured) against a minimum of 36 mN/m: fail",
    );
  });

  it("is incomplete when the specification sets no minimum", () => {
    const out = wettingTensionOutcome({
      spec: { ...SPEC, minWettingTensionMNm: null },
      samples: [sample("38")],
    });
    expect(out.samples[0].outcome).toBe("incomplete");
    expect(out.missing).toEqual(["The specification sets no minimum wetting tension."]);
    expect(out.outcome).toBe("incomplete");
  });
});
