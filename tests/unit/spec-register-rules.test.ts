import { describe, expect, it } from "vitest";
import { CleanlinessSpecError, parseCleanlinessSpec } from "@/lib/cleanliness";
import { compareCcc, compareSpecRevisions, type SpecLimits } from "@/lib/specs/compare";

function positionOf(text: string): number | undefined {
  try {
    parseCleanlinessSpec(text);
  } catch (error) {
    expect(error).toBeInstanceOf(CleanlinessSpecError);
    return (error as CleanlinessSpecError).position;
  }
  throw new Error(`${text} was accepted`);
}

describe("a malformed cleanliness-code specification names the position", () => {
  // Positions are 1-based characters of the text as typed, spaces counted [practice].
  it.each([
    ["X(E12)", 1], // unknown prefix
    ["A E12)", 3], // a bracket was due where the E stands (the space is counted, then ignored)
    ["A(B-E17/F-G1X)", 12], // "1X" is not a level: it starts at character 12
    ["A(B-E17/Z12)", 9], // Z is not a size class
    ["A(B-E17//F8)", 9], // empty group between slashes
    ["N(C-E2000/F-Gx)", 14], // a count was due after F-G
    ["A(B-E17 / F-G 25)", 15], // level 25 does not exist: position counts the spaces typed
    ["A(E12/E8)", 7], // class E limited twice: the second group
  ])("%s → character %i", (text, position) => {
    expect(positionOf(text)).toBe(position);
  });

  it("says the position in the message a person reads", () => {
    expect(() => parseCleanlinessSpec("A(B-E17/Z12)")).toThrow(
      /"Z" in "Z12" is not a size class.*\(at character 9\)/,
    );
  });
});

describe("comparing cleanliness codes of two revisions", () => {
  // Level upper bounds [std, ISO 16232:2018 level table]: 12 → 4000, 14 → 16000 [memory], 17 → 130000.
  it("a lower level on the same classes tightens", () => {
    expect(compareCcc("A(B-E17/F-G14)", "A(B-E16/F-G14)")).toMatchObject({
      direction: "tightened",
    });
    expect(compareCcc("A(B-E16/F-G14)", "A(B-E17/F-G14)")).toMatchObject({ direction: "loosened" });
  });

  it("joining two separately limited classes under the same level tightens (their sum is now capped)", () => {
    // A(EF12): E ≤ 4000 and F ≤ 4000, so E+F up to 8000 passed; A(E-F12) caps the sum at 4000.
    expect(compareCcc("A(EF12)", "A(E-F12)")).toMatchObject({ direction: "tightened" });
    expect(compareCcc("A(E-F12)", "A(EF12)")).toMatchObject({ direction: "loosened" });
  });

  it("dropping a class's limit loosens; adding one tightens", () => {
    expect(compareCcc("A(B-E17/F-G14)", "A(B-E17)")).toMatchObject({ direction: "loosened" });
    expect(compareCcc("A(B-E17)", "A(B-E17/F-G14)")).toMatchObject({ direction: "tightened" });
  });

  it("tighter in one place and looser in another is reported as both", () => {
    const change = compareCcc("A(B-E17/F-G14)", "A(B-E16/F-G15)");
    expect(change?.direction).toBe("both");
    expect(change?.reason).toMatch(/tighter at B-E16; looser at F-G14/);
  });

  it("counts per component compare as counts; a change of basis is treated as tightening", () => {
    expect(compareCcc("N(C-E2000/F-G120)", "N(C-E2000/F-G100)")).toMatchObject({
      direction: "tightened",
    });
    expect(compareCcc("N(C-E2000)", "A(C-E17)")).toMatchObject({ direction: "tightened" });
    expect(compareCcc("A( B-E17 )", "A(B-E17)")).toBeNull();
  });
});

const base: SpecLimits = {
  ccc: "A(B-D18/E15/F13/G11/H9/I-J3/K-N00)",
  maxMetallicUm: 400,
  maxNonMetallicUm: 600,
  maxFibreUm: 1000,
  gravimetricLimitMg: 2,
  gravimetricBasis: "per_component",
  minWettingTensionMNm: 38,
  visualCriteria: "No water stains",
  drynessCriteria: "Dry to touch",
  extraRequirements: null,
  customerApprovesChanges: false,
};

describe("comparing specification revisions limit by limit", () => {
  it("an unchanged revision changes nothing", () => {
    expect(compareSpecRevisions(base, { ...base })).toEqual({ changes: [], tightens: false });
  });

  it("a smaller largest particle, a lower gravimetric limit or a higher wetting tension tightens", () => {
    expect(compareSpecRevisions(base, { ...base, maxMetallicUm: 300 }).tightens).toBe(true);
    expect(compareSpecRevisions(base, { ...base, gravimetricLimitMg: 1.5 }).tightens).toBe(true);
    expect(compareSpecRevisions(base, { ...base, minWettingTensionMNm: 40 }).tightens).toBe(true);
    expect(compareSpecRevisions(base, { ...base, maxFibreUm: null }).tightens).toBe(false);
    expect(compareSpecRevisions({ ...base, maxFibreUm: null }, base).tightens).toBe(true);
    expect(
      compareSpecRevisions(base, { ...base, minWettingTensionMNm: 36 }).changes[0],
    ).toMatchObject({ field: "minWettingTensionMNm", direction: "loosened" });
  });

  it("a gravimetric limit moved to another basis cannot be compared and counts as tightening", () => {
    const result = compareSpecRevisions(base, { ...base, gravimetricBasis: "per_1000_cm2" });
    expect(result.tightens).toBe(true);
    expect(result.changes[0].reason).toMatch(/not comparable/);
  });

  it("reworded criteria are listed for a person to judge, not counted as tightening", () => {
    const result = compareSpecRevisions(base, {
      ...base,
      visualCriteria: "No water stains under 5× magnification",
    });
    expect(result.changes).toHaveLength(1);
    expect(result.changes[0].direction).toBe("changed");
    expect(result.tightens).toBe(false);
  });

  it("a customer who now approves process changes tightens", () => {
    expect(compareSpecRevisions(base, { ...base, customerApprovesChanges: true }).tightens).toBe(
      true,
    );
  });
});
