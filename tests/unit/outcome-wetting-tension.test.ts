import { describe, expect, it } from "vitest";
import { wettingTensionOutcome } from "@/lib/evidence/outcomes/wetting-tension";
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
  it("passes when the lowest reading, to the nearest 0.5 mN/m, meets the minimum", () => {
    // [std] ISO 8296 / ASTM D2578: the result is reported to the nearest 0.5 mN/m; 36.2 → 36.0 ≥ 36
    const out = wettingTensionOutcome({ spec: SPEC, samples: [sample("38, 36.2, 37")] });
    expect(out.samples[0].lines[0]).toBe("Readings 38, 36.2, 37 mN/m");
    expect(out.outcome).toBe("pass");
  });

  it("fails when one spot wets below the minimum", () => {
    // [derived] lowest 35.7 → 35.5 < 36
    expect(wettingTensionOutcome({ spec: SPEC, samples: [sample("38, 35.7")] }).outcome).toBe(
      "fail",
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
