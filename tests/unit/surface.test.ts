import { describe, expect, it } from "vitest";
import { evaluateWettingTension, roundToHalf, SurfaceInputError } from "@/lib/surface";

// Check values carry their source and tag as in ../shared/reference/standards.md.

describe("evaluateWettingTension", () => {
  it("rounds the mean to the nearest 0.5 mN/m, but judges the lowest reading as measured", () => {
    // [std] ASTM D2578 / ISO 8296 (standards.md §5): reported to the nearest 0.5 mN/m — the mean only
    expect(roundToHalf(37.74)).toBe(37.5);
    expect(roundToHalf(37.75)).toBe(38);
    expect(roundToHalf(41.2)).toBe(41);
    expect(() => roundToHalf(Number.NaN)).toThrow(SurfaceInputError);
    // [practice] a spot at 37.8 mN/m does not meet a 38 mN/m minimum: rounding it up to 38 would pass a surface that failed
    expect(evaluateWettingTension([37.8], 38)).toMatchObject({ resultMNm: 37.8, pass: false });
    expect(evaluateWettingTension([38.2, 37.9], 38)).toMatchObject({
      resultMNm: 37.9,
      pass: false,
    });
    expect(evaluateWettingTension([38, 38.2], 38)).toMatchObject({ resultMNm: 38, pass: true });
  });

  it("passes when every reading meets the minimum", () => {
    // [practice] ≥ 38 mN/m before painting or bonding (standards.md §5)
    const result = evaluateWettingTension([38, 38, 38.5], 38);
    expect(result).toMatchObject({ resultMNm: 38, meanMNm: 38, pass: true, warnings: [] });
    expect(result.reason).toBe(
      "38.0 mN/m (lowest of 3, as measured) against a minimum of 38 mN/m: pass",
    );
  });

  it("fails on the lowest reading and warns when readings spread by more than 1 mN/m", () => {
    const result = evaluateWettingTension([36, 38, 40], 38);
    expect(result.resultMNm).toBe(36);
    expect(result.meanMNm).toBe(38);
    expect(result.spreadMNm).toBe(4);
    expect(result.pass).toBe(false);
    expect(result.warnings).toHaveLength(1);
    expect(result.warnings[0]).toMatch(/spread by 4.0 mN\/m/);
  });

  it("does not warn at a spread of exactly 1 mN/m", () => {
    expect(evaluateWettingTension([38, 39], 38).warnings).toEqual([]);
    expect(evaluateWettingTension([38, 39.5], 38).warnings).toHaveLength(1);
  });

  it("refuses empty, non-finite or non-positive input", () => {
    expect(() => evaluateWettingTension([], 38)).toThrow(SurfaceInputError);
    expect(() => evaluateWettingTension([38, Number.NaN], 38)).toThrow(/Reading 2/);
    expect(() => evaluateWettingTension([-38], 38)).toThrow(RangeError);
    expect(() => evaluateWettingTension([38], 0)).toThrow(/minimum/);
    expect(() => evaluateWettingTension([38], Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});
