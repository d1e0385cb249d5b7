import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  CLEANLINESS_LEVELS,
  ISO4406_SCALE,
  CleanlinessInputError,
  CleanlinessSpecError,
  SIZE_CLASSES,
  cleanlinessCode,
  cleanlinessLevel,
  denormalizeCount,
  evaluateAgainstSpec,
  evaluateBlank,
  evaluateExtraction,
  gravimetricResidue,
  iso4406Code,
  iso4406ScaleNumber,
  levelUpperBound,
  normalizeCount,
  parseCleanlinessSpec,
  sizeClassOf,
  type Basis,
  type ParticleCounts,
} from "@/lib/cleanliness";

// Check values carry their source and tag as in ../shared/reference/standards.md:
// [std] standard or faithful quotation; [derived] computed from sourced values; [memory] recalled.

const PER_1000_CM2: Basis = { kind: "area", totalAreaCm2: 1000 }; // factor 1: counts are normalised
const WORKED_AREA: Basis = { kind: "area", totalAreaCm2: 112.05 };

/** The largest double below x, to probe the exclusive upper bound of a class. */
function justBelow(x: number): number {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  view.setBigUint64(0, view.getBigUint64(0) - 1n);
  return view.getFloat64(0);
}

describe("size classes", () => {
  it("has the ISO 16232 classes B…N with their bounds", () => {
    // [std] ISO 16232:2018 / VDA 19.1:2015 size classes (standards.md §1)
    expect(SIZE_CLASSES.map((c) => [c.key, c.minUm, c.maxUm])).toEqual([
      ["B", 5, 15],
      ["C", 15, 25],
      ["D", 25, 50],
      ["E", 50, 100],
      ["F", 100, 150],
      ["G", 150, 200],
      ["H", 200, 400],
      ["I", 400, 600],
      ["J", 600, 1000],
      ["K", 1000, 1500],
      ["L", 1500, 2000],
      ["M", 2000, 3000],
      ["N", 3000, null],
    ]);
  });

  it("classifies lower bounds inclusive, upper bounds exclusive", () => {
    // [std] lower bound inclusive, upper exclusive (standards.md §1)
    expect(sizeClassOf(5)).toBe("B");
    expect(sizeClassOf(14.999)).toBe("B");
    expect(sizeClassOf(15)).toBe("C");
    expect(sizeClassOf(100)).toBe("F");
    expect(sizeClassOf(599.9)).toBe("I");
    expect(sizeClassOf(600)).toBe("J");
    expect(sizeClassOf(3000)).toBe("N");
    expect(sizeClassOf(25_000)).toBe("N");
  });

  it("refuses sizes below 5 µm and non-numbers", () => {
    expect(() => sizeClassOf(4.99)).toThrow(CleanlinessInputError);
    expect(() => sizeClassOf(-1)).toThrow(/below the smallest size class/);
    expect(() => sizeClassOf(Number.NaN)).toThrow(RangeError);
    expect(() => sizeClassOf(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });

  it("agrees with SIZE_CLASSES at every boundary (property)", () => {
    for (const c of SIZE_CLASSES) {
      expect(sizeClassOf(c.minUm)).toBe(c.key);
      if (c.maxUm !== null) expect(sizeClassOf(justBelow(c.maxUm))).toBe(c.key);
    }
    fc.assert(
      fc.property(fc.double({ min: 5, max: 1e6, noNaN: true }), (um) => {
        const c = SIZE_CLASSES.find((s) => s.key === sizeClassOf(um))!;
        return c.minUm <= um && (c.maxUm === null || um < c.maxUm);
      }),
    );
  });
});

describe("cleanliness levels", () => {
  it("matches the derived check values", () => {
    // [derived] standards.md §1 check values
    expect(cleanlinessLevel(130)).toBe("7");
    expect(cleanlinessLevel(130.01)).toBe("8");
    expect(cleanlinessLevel(4000)).toBe("12");
    expect(cleanlinessLevel(0)).toBe("00");
  });

  it("puts each upper bound in its own level and the next count above in the next", () => {
    // [std] ISO 16232:2018 level table as quoted: 00, 0 (>0–1), 4–9 maxima 16…500, 10, 12, 17
    expect(cleanlinessLevel(0.2)).toBe("0");
    expect(cleanlinessLevel(1)).toBe("0");
    expect(cleanlinessLevel(16)).toBe("4");
    expect(cleanlinessLevel(16.5)).toBe("5");
    expect(cleanlinessLevel(32)).toBe("5");
    expect(cleanlinessLevel(64)).toBe("6");
    expect(cleanlinessLevel(250)).toBe("8");
    expect(cleanlinessLevel(500)).toBe("9");
    expect(cleanlinessLevel(501)).toBe("10");
    expect(cleanlinessLevel(1000)).toBe("10");
    expect(cleanlinessLevel(130_000)).toBe("17");
    // [memory] doubling levels, consistent with 100 × the ISO 4406 bounds
    expect(cleanlinessLevel(2)).toBe("1");
    expect(cleanlinessLevel(8)).toBe("3");
    expect(cleanlinessLevel(1001)).toBe("11");
    expect(cleanlinessLevel(250_000)).toBe("18");
    expect(cleanlinessLevel(16_000_000)).toBe("24");
    expect(cleanlinessLevel(16_000_001)).toBe(">24");
  });

  it("tabulates 26 levels with rising bounds, each 100 × its ISO 4406 scale bound", () => {
    // [derived] standards.md §1: every level bound = 100 × the ISO 4406 bound of the same number
    expect(CLEANLINESS_LEVELS).toHaveLength(26);
    expect(levelUpperBound("7")).toBe(130);
    expect(levelUpperBound("17")).toBe(130_000);
    expect(levelUpperBound("00")).toBe(0);
    expect(() => levelUpperBound("25")).toThrow(CleanlinessInputError);
  });

  it("marks which bounds were read from the standard and which are recalled", () => {
    // standards.md §1: 00, 0, 4–10, 12 and 17 [std]; 16 [std, level 17 quoted as 64,000–130,000 per 1000 cm²]; the rest [memory]
    expect(CLEANLINESS_LEVELS.filter((l) => l.source === "std").map((l) => l.level)).toEqual([
      "00",
      "0",
      "4",
      "5",
      "6",
      "7",
      "8",
      "9",
      "10",
      "12",
      "16",
      "17",
    ]);
  });

  it("agrees with 100 × the ISO 4406 bound of the same number at every level, sourced or recalled", () => {
    // [derived] standards.md §1 and §2: the published level bounds are 100 × the ISO 4406 scale bounds (0.01 × 2^N rounded)
    for (const l of CLEANLINESS_LEVELS.filter((x) => x.level !== "00"))
      expect(l.upper).toBeCloseTo(100 * ISO4406_SCALE[Number(l.level)].upperPerMl, 6);
  });

  it("refuses negative, NaN and infinite counts", () => {
    expect(() => cleanlinessLevel(-0.1)).toThrow(CleanlinessInputError);
    expect(() => cleanlinessLevel(Number.NaN)).toThrow(RangeError);
    expect(() => cleanlinessLevel(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });

  it("never falls as the count rises (property)", () => {
    const rank = (level: string) =>
      level === ">24" ? 26 : CLEANLINESS_LEVELS.findIndex((l) => l.level === level);
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e8, noNaN: true }),
        fc.double({ min: 0, max: 1e8, noNaN: true }),
        (a, b) => {
          const [low, high] = a <= b ? [a, b] : [b, a];
          return rank(cleanlinessLevel(low)) <= rank(cleanlinessLevel(high));
        },
      ),
    );
  });
});

describe("normalisation", () => {
  it("reproduces the worked example per 1000 cm²", () => {
    // [std sample report format, derived] standards.md §1: three parts, 112.05 cm²;
    // E 14, F 6, H 1 → 124.94, 53.55, 8.92 per 1000 cm²
    expect(normalizeCount(14, WORKED_AREA)).toBeCloseTo(124.94, 2);
    expect(normalizeCount(6, WORKED_AREA)).toBeCloseTo(53.55, 2);
    expect(normalizeCount(1, WORKED_AREA)).toBeCloseTo(8.92, 2);
  });

  it("normalises per 100 cm³ and per component", () => {
    // [derived] standards.md §1: n_V = n × 100 / V; N = n / components
    expect(normalizeCount(50, { kind: "volume", totalVolumeCm3: 250 })).toBe(20);
    expect(normalizeCount(14, { kind: "component", components: 4 })).toBe(3.5);
  });

  it("refuses zero or negative area and volume, negative counts and fractional components", () => {
    expect(() => normalizeCount(1, { kind: "area", totalAreaCm2: 0 })).toThrow(
      CleanlinessInputError,
    );
    expect(() => normalizeCount(1, { kind: "area", totalAreaCm2: -5 })).toThrow(
      /greater than zero/,
    );
    expect(() => normalizeCount(1, { kind: "volume", totalVolumeCm3: 0 })).toThrow(RangeError);
    expect(() => normalizeCount(1, { kind: "component", components: 0 })).toThrow(RangeError);
    expect(() => normalizeCount(1, { kind: "component", components: 2.5 })).toThrow(/whole number/);
    expect(() => normalizeCount(-1, PER_1000_CM2)).toThrow(/negative/);
    expect(() => normalizeCount(Number.NaN, PER_1000_CM2)).toThrow(RangeError);
    expect(() =>
      normalizeCount(1, { kind: "area", totalAreaCm2: Number.POSITIVE_INFINITY }),
    ).toThrow(RangeError);
  });

  it("returns the count when normalised and de-normalised (property)", () => {
    const basis = fc.oneof(
      fc
        .double({ min: 1e-3, max: 1e7, noNaN: true })
        .map((a): Basis => ({ kind: "area", totalAreaCm2: a })),
      fc
        .double({ min: 1e-3, max: 1e7, noNaN: true })
        .map((v): Basis => ({ kind: "volume", totalVolumeCm3: v })),
      fc
        .integer({ min: 1, max: 1_000_000 })
        .map((n): Basis => ({ kind: "component", components: n })),
    );
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 100_000_000 }), basis, (count, b) => {
        const back = denormalizeCount(normalizeCount(count, b), b);
        return Math.abs(back - count) <= 1e-9 * Math.max(1, count);
      }),
    );
  });
});

describe("cleanlinessCode", () => {
  it("writes the worked example as a CCC", () => {
    // [std sample report format, derived levels] standards.md §1: E7, F6, H4, all other classes 00
    expect(cleanlinessCode({ E: 14, F: 6, H: 1 }, WORKED_AREA)).toBe(
      "A(E7/F6/G00/H4/I00/J00/K00/L00/M00/N00)",
    );
    expect(
      cleanlinessCode({ E: 14, F: 6, H: 1 }, WORKED_AREA, {
        classes: ["B", "C", "D", "E", "F", "G", "H", "I", "J", "K"],
      }),
    ).toBe("A(B00/C00/D00/E7/F6/G00/H4/I00/J00/K00)");
  });

  it("starts at the smallest class present, zero or not", () => {
    expect(cleanlinessCode({ B: 0, E: 14, F: 6, H: 1 }, WORKED_AREA)).toBe(
      "A(B00/C00/D00/E7/F6/G00/H4/I00/J00/K00/L00/M00/N00)",
    );
  });

  it("uses V per 100 cm³ and N with counts per component", () => {
    // [std] ISO 16232 CCC notation: V per 100 cm³; N per component with counts (standards.md §1)
    expect(cleanlinessCode({ J: 3, K: 1 }, { kind: "volume", totalVolumeCm3: 300 })).toBe(
      "V(J0/K0/L00/M00/N00)",
    );
    expect(cleanlinessCode({ J: 5, K: 1 }, { kind: "volume", totalVolumeCm3: 100 })).toBe(
      "V(J3/K0/L00/M00/N00)",
    );
    expect(cleanlinessCode({ E: 14, F: 6, H: 1 }, { kind: "component", components: 3 })).toBe(
      "N(E4.67/F2/G0/H0.33/I0/J0/K0/L0/M0/N0)",
    );
  });

  it("treats a class set to undefined as absent", () => {
    expect(cleanlinessCode({ B: undefined, E: 14, F: 6, H: 1 }, WORKED_AREA)).toBe(
      "A(E7/F6/G00/H4/I00/J00/K00/L00/M00/N00)",
    );
  });

  it("refuses unknown classes, negative counts and counts outside the listed classes", () => {
    expect(() =>
      cleanlinessCode({ E: 1, toString: 2 } as unknown as ParticleCounts, PER_1000_CM2),
    ).toThrow(/"toString" is not a size class/);
    expect(() => cleanlinessCode({ X: 1 } as ParticleCounts, PER_1000_CM2)).toThrow(
      /not a size class/,
    );
    expect(() => cleanlinessCode({ b: 1 } as ParticleCounts, PER_1000_CM2)).toThrow(
      CleanlinessInputError,
    );
    expect(() => cleanlinessCode({ E: -1 }, PER_1000_CM2)).toThrow(/class E/);
    expect(() => cleanlinessCode({ E: Number.NaN }, PER_1000_CM2)).toThrow(RangeError);
    expect(() => cleanlinessCode({ E: 1, N: 1 }, PER_1000_CM2, { classes: ["E", "F"] })).toThrow(
      /Class N has particles/,
    );
    expect(() => cleanlinessCode({ E: 1 }, PER_1000_CM2, { classes: ["F", "E"] })).toThrow(
      /from B towards N/,
    );
  });
});

describe("parseCleanlinessSpec", () => {
  it("reads hyphen-joined classes as one limit on their sum", () => {
    // [std] ISO 16232:2018 / VDA 19.1:2015 notation (standards.md §1)
    const spec = parseCleanlinessSpec("A(B-E17/F-G14/H-I4/J-K2/L-N00)");
    expect(spec.basis).toBe("area");
    expect(spec.groups.map((g) => [g.classes.join(""), g.joined, g.level, g.limit])).toEqual([
      ["BCDE", true, "17", 130_000],
      ["FG", true, "14", 16_000],
      ["HI", true, "4", 16],
      ["JK", true, "2", 4],
      ["LMN", true, "00", 0],
    ]);
  });

  it("reads N() specifications with counts per component", () => {
    // [std] standards.md §1: N(C-E32000/F-G1000/H-I16/J-K0)
    const spec = parseCleanlinessSpec("N(C-E32000/F-G1000/H-I16/J-K0)");
    expect(spec.basis).toBe("component");
    expect(spec.groups.map((g) => [g.classes.join(""), g.level, g.limit])).toEqual([
      ["CDE", null, 32_000],
      ["FG", null, 1000],
      ["HI", null, 16],
      ["JK", null, 0],
    ]);
  });

  it("reads letters written together as each limited on its own", () => {
    // [std] standards.md §1: A(EF12/G-H10/I0/J00)
    const spec = parseCleanlinessSpec(" A( EF12 / G-H10 / I0 / J00 ) ");
    expect(spec.text).toBe("A(EF12/G-H10/I0/J00)");
    expect(spec.groups[0]).toMatchObject({ classes: ["E", "F"], joined: false, limit: 4000 });
  });

  it.each([
    ["A(E12", /not in CCC notation/],
    ["X(E12)", /not a specification prefix/],
    ["A()", /no limits/],
    ["A(O12)", /"O" in "O12" is not a size class/],
    ["A(A12)", /not a size class/],
    ["A(e12)", /capital letters/],
    ["A(B-E17/E12)", /Class E is limited twice/],
    ["A(EF12/F-G10)", /Class F is limited twice/],
    ["A(E-B17)", /reversed/],
    ["A(E-E17)", /reversed|empty/],
    ["A(BC-E17)", /exactly two letters/],
    ["A(FE12)", /from small to large/],
    ["A(E25)", /not a cleanliness level/],
    ["A(E05)", /not a cleanliness level/],
    ["A(E)", /not a cleanliness level/],
    ["A(E12//F8)", /Empty limit/],
    ["N(E-F)", /count per component/],
    ["N(E1e3)", /count per component/],
  ])("refuses %s", (text, message) => {
    expect(() => parseCleanlinessSpec(text)).toThrow(CleanlinessSpecError);
    expect(() => parseCleanlinessSpec(text)).toThrow(message);
  });
});

describe("evaluateAgainstSpec", () => {
  it("limits letters written together each on its own and joined classes on their sum", () => {
    // [std] standards.md §1: in A(EF12/G-H10/I0/J00) E and F may each have ≤ 4000,
    // G and H together ≤ 1000, I ≤ 1, J none
    const spec = "A(EF12/G-H10/I0/J00)";
    const ok = evaluateAgainstSpec({ E: 4000, F: 4000, G: 500, H: 500, I: 1 }, PER_1000_CM2, spec);
    expect(ok.pass).toBe(true);
    expect(ok.rows.map((r) => [r.classes.join(""), r.value, r.limit, r.pass])).toEqual([
      ["E", 4000, 4000, true],
      ["F", 4000, 4000, true],
      ["GH", 1000, 1000, true],
      ["I", 1, 1, true],
      ["J", 0, 0, true],
    ]);

    const failing = evaluateAgainstSpec({ E: 4001, G: 600, H: 401, J: 1 }, PER_1000_CM2, spec);
    expect(failing.pass).toBe(false);
    expect(failing.rows.map((r) => r.pass)).toEqual([false, true, false, true, false]);
    expect(failing.rows[0].reason).toBe("E: 4001 per 1000 cm² → level 13, limit 12 (≤ 4000): fail");
    expect(failing.rows[2].reason).toBe(
      "G-H: 1001 per 1000 cm² → level 11, limit 10 (≤ 1000): fail",
    );
  });

  it("explains a pass in words", () => {
    // [derived] worked example E 124.94 per 1000 cm² → level 7, against a level-8 limit
    const result = evaluateAgainstSpec({ E: 14, F: 6, H: 1 }, WORKED_AREA, "A(E8/F-G7/H4)");
    expect(result.pass).toBe(true);
    expect(result.rows[0]).toMatchObject({ level: "7", limitLevel: "8", limit: 250, pass: true });
    expect(result.rows[0].reason).toBe("E: 124.9 per 1000 cm² → level 7, limit 8 (≤ 250): pass");
    expect(result.rows[2].reason).toBe("H: 8.92 per 1000 cm² → level 4, limit 4 (≤ 16): pass");
  });

  it("keeps the reason, built when read, in the row's JSON with every other field", () => {
    // [derived] the same worked example; a stored or sent evaluation must not lose its words
    const result = evaluateAgainstSpec({ E: 14, F: 6, H: 1 }, WORKED_AREA, "A(E8/F-G7/H4)");
    expect(JSON.parse(JSON.stringify(result.rows[0]))).toEqual({
      classes: ["E"],
      value: result.rows[0].value,
      limit: 250,
      level: "7",
      limitLevel: "8",
      pass: true,
      reason: "E: 124.9 per 1000 cm² → level 7, limit 8 (≤ 250): pass",
    });
    const perComponent = evaluateAgainstSpec(
      { C: 32000 },
      { kind: "component", components: 1 },
      "N(C-E32000)",
    );
    expect(JSON.parse(JSON.stringify(perComponent.rows[0]))).toEqual({
      classes: ["C", "D", "E"],
      value: 32000,
      limit: 32000,
      pass: true,
      reason: "C-E: 32000 per component, limit 32000: pass",
    });
  });

  it("passes a count equal to the level's upper bound and fails one just above", () => {
    // [derived] count ≤ upper bound of the specified level passes: 130 → 7, 130.01 → 8
    expect(evaluateAgainstSpec({ E: 13 }, { kind: "area", totalAreaCm2: 100 }, "A(E7)").pass).toBe(
      true,
    );
    expect(evaluateAgainstSpec({ E: 130.01 }, PER_1000_CM2, "A(E7)").pass).toBe(false);
  });

  it("compares per-component counts with N() limits", () => {
    // [std] standards.md §1: N(C-E32000/F-G1000/H-I16/J-K0), counts per component
    const basis: Basis = { kind: "component", components: 10 };
    const spec = "N(C-E32000/F-G1000/H-I16/J-K0)";
    const result = evaluateAgainstSpec(
      { C: 200_000, D: 80_000, E: 40_000, H: 150, I: 10 },
      basis,
      spec,
    );
    expect(result.pass).toBe(true);
    expect(result.rows[0].value).toBe(32_000);
    expect(result.rows[0].reason).toBe("C-E: 32000 per component, limit 32000: pass");
    const withJ = evaluateAgainstSpec({ J: 1 }, basis, spec);
    expect(withJ.pass).toBe(false);
    expect(withJ.rows[3].reason).toBe("J-K: 0.1 per component, limit 0: fail");
  });

  it("treats classes missing from the counts as 0 and leaves classes missing from the spec unlimited", () => {
    const result = evaluateAgainstSpec({ B: 1_000_000 }, PER_1000_CM2, "A(E00)");
    expect(result.pass).toBe(true);
    expect(result.rows).toHaveLength(1);
  });

  it("accepts a parsed specification and refuses a mismatched basis", () => {
    const spec = parseCleanlinessSpec("V(E-F10)");
    expect(
      evaluateAgainstSpec({ E: 500, F: 500 }, { kind: "volume", totalVolumeCm3: 100 }, spec).pass,
    ).toBe(true);
    expect(() => evaluateAgainstSpec({ E: 1 }, PER_1000_CM2, spec)).toThrow(/per 100 cm³/);
    expect(() => evaluateAgainstSpec({ E: -1 }, PER_1000_CM2, "A(E8)")).toThrow(
      CleanlinessInputError,
    );
  });

  it("always passes its own code as a specification (property)", () => {
    const counts = fc.record(
      { B: fc.nat(10_000_000), E: fc.nat(100_000), H: fc.nat(1000), K: fc.nat(20) },
      { requiredKeys: [] },
    );
    const basis = fc.oneof(
      fc
        .double({ min: 1, max: 1e5, noNaN: true })
        .map((a): Basis => ({ kind: "area", totalAreaCm2: a })),
      fc
        .double({ min: 1, max: 1e5, noNaN: true })
        .map((v): Basis => ({ kind: "volume", totalVolumeCm3: v })),
    );
    fc.assert(
      fc.property(counts, basis, (c, b) => {
        const code = cleanlinessCode(c, b);
        return code.includes(">24") || evaluateAgainstSpec(c, b, code).pass;
      }),
    );
  });
});

describe("evaluateExtraction", () => {
  it("completes at the first extraction with a decay value ≤ 10 %", () => {
    // [derived] standards.md §1: 100, 30, 8 → 8/138 = 5.8 % → complete at n = 3
    const result = evaluateExtraction([100, 30, 8]);
    expect(result.complete).toBe(true);
    expect(result.step).toBe(3);
    expect(result.ratios[0]).toBe(1);
    expect(result.ratios[1]).toBeCloseTo(30 / 130, 12);
    expect(result.ratios[2]).toBeCloseTo(0.058, 3);
    expect(result.status).toBe("complete");
  });

  it("is not complete while the decay value stays above 10 %", () => {
    // [derived] standards.md §1: 100, 40, 20 → 12.5 % → not complete
    const result = evaluateExtraction([100, 40, 20]);
    expect(result).toMatchObject({ complete: false, step: null, status: "extract-again" });
    expect(result.ratios[2]).toBeCloseTo(0.125, 12);
  });

  it("asks for new parameters when 6 extractions do not reach the limit", () => {
    // [std] VDA 19.1 / ISO 16232: not reached within 6 extractions → change the parameters
    const result = evaluateExtraction([100, 80, 70, 60, 50, 45, 5]);
    expect(result).toMatchObject({ complete: false, step: null, status: "change-parameters" });
    expect(result.ratios).toHaveLength(6);
  });

  it("does not evaluate extractions after the one that completed", () => {
    const result = evaluateExtraction([100, 5, 80]);
    expect(result.step).toBe(2);
    expect(result.ratios).toHaveLength(2);
  });

  it("honours other limits", () => {
    expect(evaluateExtraction([100, 40, 20], { maxRatio: 0.15 }).step).toBe(3);
    expect(evaluateExtraction([100, 40, 20, 5], { maxExtractions: 3 }).status).toBe(
      "change-parameters",
    );
  });

  it("refuses empty series, negative or non-finite counts, and bad options", () => {
    expect(() => evaluateExtraction([])).toThrow(CleanlinessInputError);
    expect(() => evaluateExtraction([100, -1])).toThrow(/Extraction 2/);
    expect(() => evaluateExtraction([100, Number.NaN])).toThrow(RangeError);
    expect(() => evaluateExtraction([Number.POSITIVE_INFINITY])).toThrow(RangeError);
    expect(() => evaluateExtraction([0, 0])).toThrow(/undefined/);
    expect(() => evaluateExtraction([100], { maxRatio: 0 })).toThrow(/between 0 and 1/);
    expect(() => evaluateExtraction([100], { maxRatio: 1 })).toThrow(RangeError);
    expect(() => evaluateExtraction([100], { maxExtractions: 0 })).toThrow(RangeError);
    expect(() => evaluateExtraction([100], { maxExtractions: 2.5 })).toThrow(/whole number/);
  });

  it("never reports complete when its last ratio exceeds maxRatio (property)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 100_000 }),
        fc.array(fc.nat(100_000), { maxLength: 9 }),
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.integer({ min: 1, max: 10 }),
        (first, rest, maxRatio, maxExtractions) => {
          const r = evaluateExtraction([first, ...rest], { maxRatio, maxExtractions });
          const last = r.ratios[r.ratios.length - 1];
          if (r.complete) return last <= maxRatio && r.step === r.ratios.length;
          return r.ratios.every((x) => x > maxRatio) && r.ratios.length <= maxExtractions;
        },
      ),
    );
  });
});

describe("evaluateBlank", () => {
  it("allows at most 10 % of each specified limit", () => {
    // [std] VDA 19.1:2015: particle blank ≤ 10 % of the specified value per size class
    const result = evaluateBlank({ E: 400, F: 401 }, { E: 4000, F: 4000 });
    expect(result.rows.map((r) => [r.classes[0], r.allowed, r.pass])).toEqual([
      ["E", 400, true],
      ["F", 400, false],
    ]);
    expect(result.pass).toBe(false);
    expect(result.rows[1].reason).toBe("F: blank 401, allowed 10.0 % of 4000 = 400: fail");
  });

  it("reads limits from a CCC specification, joined classes on their sum", () => {
    // [std] standards.md §1 notation; [derived] 10 % of the level bounds
    const result = evaluateBlank({ G: 60, H: 40, I: 0 }, "A(EF12/G-H10/I0/J00)");
    expect(result.rows.map((r) => [r.classes.join(""), r.blank, r.allowed, r.pass])).toEqual([
      ["E", 0, 400, true],
      ["F", 0, 400, true],
      ["GH", 100, 100, true],
      ["I", 0, 0.1, true],
      ["J", 0, 0, true],
    ]);
    expect(result.pass).toBe(true);
  });

  it("refuses any blank particle in a class limited to none or above the largest allowed size", () => {
    // [std] VDA 19.1:2015: no blank particle larger than the specified maximum particle size
    expect(evaluateBlank({ J: 1 }, "A(I4/J00)").pass).toBe(false);
    const result = evaluateBlank({ E: 1, K: 1 }, { E: 1000 }, { largestAllowedUm: 1000 });
    expect(result.rows[0].pass).toBe(true);
    expect(result.largestParticle).toEqual({
      pass: false,
      reason: "Blank particle above 1000 µm: class K (≥ 1000 µm) holds 1: fail",
    });
    expect(result.pass).toBe(false);
    const measured = evaluateBlank(
      { I: 1 },
      { I: 100 },
      { largestAllowedUm: 500, largestBlankParticleUm: 520 },
    );
    expect(measured.largestParticle?.pass).toBe(false);
    const fine = evaluateBlank(
      { I: 1 },
      { I: 100 },
      { largestAllowedUm: 600, largestBlankParticleUm: 520 },
    );
    expect(fine.pass).toBe(true);
  });

  it("refuses bad input", () => {
    expect(() => evaluateBlank({ E: -1 }, { E: 100 })).toThrow(CleanlinessInputError);
    expect(() => evaluateBlank({ E: 1 }, {})).toThrow(/at least one specified limit/);
    expect(() => evaluateBlank({ E: 1 }, { E: 100 }, { maxFraction: 1.5 })).toThrow(RangeError);
    expect(() => evaluateBlank({ E: 1 }, { E: 100 }, { largestAllowedUm: 0 })).toThrow(RangeError);
  });
});

describe("gravimetricResidue", () => {
  it("gives mg per component and per 1000 cm², and judges the blank against 10 % of the residue", () => {
    // [std] ISO 16232 gravimetry: residue = after − before; [memory] per 1000 cm² normalisation;
    // [std] VDA 19.1: gravimetric blank ≤ 10 % of the residue mass
    const result = gravimetricResidue({
      filterBeforeMg: 85.42,
      filterAfterMg: 89.42,
      blankMg: 0.3,
      components: 5,
      totalAreaCm2: 800,
    });
    expect(result.residueMg).toBe(4);
    expect(result.perComponentMg).toBe(0.8);
    expect(result.per1000Cm2Mg).toBe(5);
    expect(result.belowPracticalLimit).toBe(false);
    expect(result.blankOk).toBe(true);
    expect(result.blankFraction).toBeCloseTo(0.075, 12);
  });

  it("flags residues under the 1 mg practical limit and blanks above 10 %", () => {
    // [std] ISO 16232: lower limit of meaningful results about 1 mg
    const result = gravimetricResidue({
      filterBeforeMg: 100,
      filterAfterMg: 100.8,
      blankMg: 0.09,
      components: 1,
    });
    expect(result.residueMg).toBe(0.8);
    expect(result.belowPracticalLimit).toBe(true);
    expect(result.blankOk).toBe(false);
    expect(result.per1000Cm2Mg).toBeNull();
    expect(result.notes[0]).toMatch(/below the practical limit of 1 mg/);
  });

  it("refuses impossible weighings", () => {
    expect(() =>
      gravimetricResidue({ filterBeforeMg: 100, filterAfterMg: 99, components: 1 }),
    ).toThrow(/lighter/);
    expect(() =>
      gravimetricResidue({ filterBeforeMg: 100, filterAfterMg: 101, components: 0 }),
    ).toThrow(RangeError);
    expect(() =>
      gravimetricResidue({
        filterBeforeMg: 100,
        filterAfterMg: 101,
        components: 1,
        totalAreaCm2: 0,
      }),
    ).toThrow(RangeError);
    expect(() =>
      gravimetricResidue({ filterBeforeMg: Number.NaN, filterAfterMg: 101, components: 1 }),
    ).toThrow(CleanlinessInputError);
  });
});

describe("ISO 4406", () => {
  it("codes the worked example", () => {
    // [std] standards.md §2, as quoted: 3000 / 500 / 7 particles per mL → 19/16/10
    expect(iso4406Code([3000, 500, 7])).toBe("19/16/10");
  });

  it("uses the published rounded bounds", () => {
    // [std] standards.md §2 as quoted: 13 = >40–80, 17 = >640–1300, 18 = >1300–2500, 20 = >5k–10k
    expect(iso4406ScaleNumber(80)).toBe("13");
    expect(iso4406ScaleNumber(80.1)).toBe("14");
    expect(iso4406ScaleNumber(1300)).toBe("17");
    expect(iso4406ScaleNumber(1301)).toBe("18");
    expect(iso4406ScaleNumber(10_000)).toBe("20");
    // [std] ISO 4406:1999 table as reprinted in filter handbooks: 0 = ≤0.01, 7 = >0.64–1.3, 28 = ≤2,500,000
    expect(iso4406ScaleNumber(0.01)).toBe("0");
    expect(iso4406ScaleNumber(1.3)).toBe("7");
    expect(iso4406ScaleNumber(1.31)).toBe("8");
    expect(iso4406ScaleNumber(2_500_000)).toBe("28");
    expect(iso4406ScaleNumber(2_500_001)).toBe(">28");
    // [std] handbook example 14/12/7: 80–160, 20–40 and 0.64–1.3 particles per mL
    expect(iso4406Code([120, 30, 1])).toBe("14/12/7");
  });

  it("refuses counts that rise with size, negatives and wrong lengths", () => {
    expect(() => iso4406Code([500, 3000, 7])).toThrow(/cumulative/);
    expect(() => iso4406Code([3000, 500, -1])).toThrow(CleanlinessInputError);
    expect(() => iso4406Code([3000, 500] as unknown as [number, number, number])).toThrow(
      /three counts/,
    );
    expect(() => iso4406Code([Number.NaN, 1, 1])).toThrow(RangeError);
  });
});
