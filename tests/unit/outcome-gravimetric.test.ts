import { describe, expect, it } from "vitest";
import {
  gravimetricOutcome,
  type GravimetricOutcomeInput,
} from "@/lib/evidence/outcomes/gravimetric";
import { gravimetricSampleSchema } from "@/lib/schemas/evidence";

const SPEC = {
  ccc: "A(E8)",
  maxMetallicUm: null,
  maxNonMetallicUm: null,
  maxFibreUm: null,
  gravimetricLimitMg: 1.5,
  gravimetricBasis: "per_component" as const,
  minWettingTensionMNm: null,
};
const FAMILY = { wettedAreaCm2: 37.35, wettedVolumeCm3: null };
const sample = (raw: Record<string, unknown>) => ({
  sampleLabel: "G-1",
  worstCase: true,
  data: gravimetricSampleSchema.parse({
    sampleLabel: "G-1",
    components: "3",
    filterBeforeMg: "100",
    filterAfterMg: "103",
    ...raw,
  }),
});
const input = (
  over: Partial<GravimetricOutcomeInput> & {
    limit?: number | null;
    basis?: "per_component" | "per_1000_cm2";
  },
): GravimetricOutcomeInput => ({
  family: FAMILY,
  spec: {
    ...SPEC,
    gravimetricLimitMg: over.limit === undefined ? SPEC.gravimetricLimitMg : over.limit,
    gravimetricBasis: over.basis ?? SPEC.gravimetricBasis,
  },
  samples: over.samples ?? [sample({})],
});

describe("gravimetric outcome", () => {
  it("passes a residue per component within the limit", () => {
    // [derived] (103 − 100) mg / 3 components = 1 mg per component ≤ 1.5 mg
    const out = gravimetricOutcome(input({}));
    expect(out.samples[0].lines[0]).toMatch(/= 3 mg over 3 component\(s\) → 1 mg per component/);
    expect(out.samples[0].lines.at(-1)).toBe("Limit 1.5 mg per component: pass");
    expect(out.outcome).toBe("pass");
  });

  it("fails a residue above the limit", () => {
    expect(gravimetricOutcome(input({ limit: 0.8 })).outcome).toBe("fail");
  });

  it("judges per 1000 cm² when the specification says so", () => {
    // [derived] 3 mg on 3 × 37.35 = 112.05 cm² → 26.774 mg per 1000 cm² (same normalisation as particle counts, [memory] ISO 16232)
    const out = gravimetricOutcome(input({ limit: 25, basis: "per_1000_cm2" }));
    expect(out.samples[0].lines[0]).toMatch(/→ 26\.774 mg per 1000 cm²/);
    expect(out.outcome).toBe("fail");
  });

  it("leaves a sample unqualified when its blank exceeds 10 % of the residue", () => {
    // [std] VDA 19.1:2015: gravimetric blank ≤ 10 % of the residue mass; 0.4 mg > 0.3 mg
    const out = gravimetricOutcome(input({ samples: [sample({ blankMg: "0.4" })] }));
    expect(out.samples[0].outcome).toBe("incomplete");
    expect(out.outcome).toBe("incomplete");
    // [std] the same rule: 0.3 mg is exactly 10 % and qualifies
    expect(gravimetricOutcome(input({ samples: [sample({ blankMg: "0.3" })] })).outcome).toBe(
      "pass",
    );
  });

  it("does not pass a residue below the practical lower limit: not qualified, pool more parts", () => {
    // [std] ISO 16232 gravimetry (standards.md §1): results below about 1 mg are not meaningful without a controlled climate; 0.6 mg < 1 mg
    const out = gravimetricOutcome(input({ samples: [sample({ filterAfterMg: "100.6" })] }));
    expect(out.samples[0].outcome).toBe("incomplete");
    expect(out.samples[0].lines.at(-1)).toMatch(
      /^Not qualified: .*practical lower limit of 1 mg\. Pool more parts/,
    );
    expect(out.outcome).toBe("incomplete");
  });

  it("never subtracts the blank: the residue and the verdict are the same with or without it", () => {
    // [std] VDA 19.1:2015 (standards.md §1): the blank is not subtracted; it qualifies the measurement. 0.2 mg ≤ 10 % of 3 mg
    const withBlank = gravimetricOutcome(input({ samples: [sample({ blankMg: "0.2" })] }));
    expect(withBlank.samples[0].lines[0]).toMatch(
      /= 3 mg over 3 component\(s\) → 1 mg per component/,
    );
    expect(withBlank.outcome).toBe("pass");
  });

  it("is incomplete when the specification sets no gravimetric limit", () => {
    const out = gravimetricOutcome(input({ limit: null }));
    expect(out.outcome).toBe("incomplete");
    expect(out.missing).toEqual(["The specification sets no gravimetric limit."]);
  });
});
