import { describe, expect, it } from "vitest";
import { particleOutcome } from "@/lib/evidence/outcomes/particle";
import {
  analysedClasses,
  countedBelowLimit,
  largestAgainstCounts,
} from "@/lib/lab-report/analysed-classes";
import { countRows } from "@/lib/lab-report/count-rows";
import { particleRunDataSchema, particleSampleSchema } from "@/lib/schemas/evidence";

// Check values carry their source and tag as in ../shared/reference/standards.md.

const SPEC = {
  ccc: "A(E8/F7/G-H6/I-N00)",
  maxMetallicUm: 400,
  maxNonMetallicUm: 600,
  maxFibreUm: 1000,
  gravimetricLimitMg: null,
  gravimetricBasis: null,
  minWettingTensionMNm: null,
};
const FAMILY = { wettedAreaCm2: 37.35, wettedVolumeCm3: null };
const qualified = particleRunDataSchema.parse({
  extractionSeries: "100, 30, 8",
  blankMeasured: "on",
  blankCounts: {},
});
const sample = (raw: Record<string, unknown>) => ({
  sampleLabel: "P-1",
  worstCase: false,
  data: particleSampleSchema.parse({ sampleLabel: "P-1", components: "3", largest: {}, ...raw }),
});

describe("classes analysed and not analysed", () => {
  it("analyses a class only when the lower size limit is at or below its lower bound", () => {
    // [std] ISO 16232 size classes (standards.md §1): D 25–50, E 50–100 µm
    expect(analysedClasses(50)[0]).toBe("E");
    expect(analysedClasses(25)[0]).toBe("D");
    // 30 µm lies inside D: D is not analysed whole
    expect(analysedClasses(30)[0]).toBe("E");
    expect(analysedClasses(null)).toHaveLength(13);
    expect(countedBelowLimit({ D: 3, E: 1 }, 50)).toEqual(["D"]);
    expect(countedBelowLimit({ E: 1 }, 50)).toEqual([]);
  });

  it("prints a class below the limit as not analysed, never 0, in the report's table", () => {
    // [std] worked example (standards.md §1): E 14 on 112.05 cm² → 124.94 per 1000 cm², level 7
    const rows = countRows({ E: 14 }, { kind: "area", totalAreaCm2: 112.05 }, 50);
    expect(rows.find((r) => r.key === "D")).toMatchObject({
      analysed: false,
      absolute: null,
      level: null,
    });
    expect(rows.find((r) => r.key === "E")).toMatchObject({
      analysed: true,
      absolute: 14,
      level: "7",
    });
    expect(rows.find((r) => r.key === "E")!.normalised).toBeCloseTo(124.94, 2);
    expect(rows.find((r) => r.key === "F")).toMatchObject({ absolute: 0, level: "00" });
  });

  it("builds the code only from the classes analysed", () => {
    // [std] worked example: E 14, F 6, H 1 over 112.05 cm² → E7, F6, H4
    const out = particleOutcome({
      family: FAMILY,
      spec: SPEC,
      samples: [sample({ counts: { E: "14", F: "6", H: "1" } })],
      runData: qualified,
      lowerSizeLimitUm: 50,
    });
    expect(out.code).toBe("A(E7/F6/G00/H4/I00/J00/K00/L00/M00/N00)");
    expect(out.outcome).toBe("pass");
  });
});

describe("largest particles against the counts and the specification", () => {
  it("flags a largest particle whose class holds no particle, or below a larger one counted", () => {
    // [std] size classes: 760 µm is class J (600–1000 µm); 350 µm is class H (200–400 µm)
    expect(largestAgainstCounts("Largest fibre", 760, { H: 2, J: 1 })).toEqual({
      consistent: true,
    });
    expect(largestAgainstCounts("Largest fibre", 760, { H: 2 })).toMatchObject({
      consistent: false,
    });
    const below = largestAgainstCounts("Largest particle", 350, { H: 1, K: 1 });
    expect(below).toMatchObject({ consistent: false });
    expect((below as { reason: string }).reason).toMatch(/class K holds particles/);
  });

  it("judges each type against its own limit and flags a type's largest outside its split counts", () => {
    const out = particleOutcome({
      family: FAMILY,
      spec: SPEC,
      samples: [
        sample({
          counts: { E: "14", F: "6", H: "2", J: "1" },
          splitMeasured: "on",
          metallic: { H: "1" },
          nonMetallic: { E: "14", F: "6", H: "1" },
          fibre: { J: "1" },
          // Non-metallic 420 µm lies in class I, where no non-metallic particle was counted.
          largest: { metallicUm: "380", nonMetallicUm: "420", fibreUm: "700" },
        }),
      ],
      runData: qualified,
    });
    const lines = out.samples[0].lines;
    expect(lines).toContain("Largest metallic particle 380 µm, limit 400 µm: pass");
    expect(lines).toContain("Largest non-metallic particle 420 µm, limit 600 µm: pass");
    expect(lines).toContain("Largest fibre particle 700 µm, limit 1,000 µm: pass");
    expect(lines).toContain("Particle types: metallic (reflective) 1, non-metallic 21, fibres 1");
    expect(lines.filter((l) => l.startsWith("Flag:"))).toEqual([
      "Flag: Largest non-metallic particle 420 µm lies in class I, which holds no counted particle.",
    ]);
  });

  it("fails a type over its own limit even when every class count passes [std, the specification's largest-particle limit per type]", () => {
    const out = particleOutcome({
      family: FAMILY,
      spec: { ...SPEC, maxMetallicUm: 300 },
      samples: [sample({ counts: { E: "14", H: "1" }, largest: { metallicUm: "350" } })],
      runData: qualified,
    });
    expect(out.samples[0].lines).toContain("Largest metallic particle 350 µm, limit 300 µm: fail");
    expect(out.samples[0].lines.filter((l) => l.endsWith(": fail"))).toHaveLength(1);
    expect(out.outcome).toBe("fail");
  });
});
