import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  conductivityAt25C,
  conductivityAt25CNonLinear,
  f25NaturalWater,
  ISO7888_F25,
  WaterInputError,
} from "@/lib/water";

// Check values carry their source and tag as in ../shared/reference/standards.md.

describe("conductivityAt25C (linear)", () => {
  it("matches the check value", () => {
    // [derived] standards.md §6: κ25 = κT / (1 + α (T − 25)); 500 µS/cm at 20 °C, α 2 %/°C → 555.6
    expect(conductivityAt25C(500, 20)).toBeCloseTo(555.6, 1);
  });

  it("leaves 25 °C readings alone and follows the given coefficient", () => {
    // [derived] same formula
    expect(conductivityAt25C(500, 25)).toBe(500);
    expect(conductivityAt25C(500, 30, 0.019)).toBeCloseTo(500 / 1.095, 9);
    expect(conductivityAt25C(0.05, 40)).toBeCloseTo(0.05 / 1.3, 12);
    expect(conductivityAt25C(500, 20, 0)).toBe(500);
  });

  it("inverts the temperature dependence it assumes (property)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 200_000, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 0.035, noNaN: true }), // keeps 1 + α(T − 25) > 0 down to 0 °C
        (k25, t, alpha) => {
          const measured = k25 * (1 + alpha * (t - 25));
          return Math.abs(conductivityAt25C(measured, t, alpha) - k25) <= 1e-9 * Math.max(1, k25);
        },
      ),
    );
  });

  it("refuses negative or non-finite readings, impossible temperatures and coefficients", () => {
    expect(() => conductivityAt25C(-1, 20)).toThrow(WaterInputError);
    expect(() => conductivityAt25C(Number.NaN, 20)).toThrow(RangeError);
    expect(() => conductivityAt25C(500, Number.POSITIVE_INFINITY)).toThrow(RangeError);
    expect(() => conductivityAt25C(500, -5)).toThrow(/between 0 and 100 °C/);
    expect(() => conductivityAt25C(500, 120)).toThrow(RangeError);
    expect(() => conductivityAt25C(500, 20, -0.02)).toThrow(/temperature coefficient/);
    expect(() => conductivityAt25C(500, 20, 0.5)).toThrow(RangeError);
  });
});

describe("conductivityAt25CNonLinear (ISO 7888)", () => {
  it("applies the tabulated factors", () => {
    // [std] standards.md §6, as quoted: f25(20 °C) = 1.116, f25(30 °C) = 0.903
    expect(f25NaturalWater(20)).toBe(1.116);
    expect(f25NaturalWater(30)).toBe(0.903);
    expect(conductivityAt25CNonLinear(500, 20)).toBeCloseTo(558, 9);
    expect(conductivityAt25CNonLinear(500, 30)).toBeCloseTo(451.5, 9);
    // [derived] f25(25 °C) = 1 at the reference temperature
    expect(conductivityAt25CNonLinear(500, 25)).toBe(500);
  });

  it("uses the published whole-degree factors across 0–35 °C", () => {
    // [std] ISO 7888 table of f25 for natural water (as reprinted in a meter manual): 0 → 1.918, 10 → 1.428, 15 → 1.256, 35 → 0.822
    expect(f25NaturalWater(0)).toBe(1.918);
    expect(f25NaturalWater(10)).toBe(1.428);
    expect(f25NaturalWater(15)).toBe(1.256);
    expect(f25NaturalWater(35)).toBe(0.822);
    // [std] the same table's tenth-degree column: f25(20.5 °C) = 1.103; linear interpolation gives 1.1035
    expect(f25NaturalWater(20.5)).toBeCloseTo(1.103, 2);
    expect(Math.abs(f25NaturalWater(20.5) - 1.103)).toBeLessThanOrEqual(0.001);
  });

  it("interpolates linearly between whole degrees", () => {
    // [derived] halfway between 22 °C (1.067) and 23 °C (1.044)
    expect(f25NaturalWater(22.5)).toBeCloseTo(1.0555, 12);
  });

  it("states the source of every factor and refuses temperatures outside the table", () => {
    expect(ISO7888_F25).toHaveLength(36);
    expect(ISO7888_F25.every((p) => /^\[(std|derived|memory)\]/.test(p.source))).toBe(true);
    expect(() => conductivityAt25CNonLinear(500, 35.1)).toThrow(/outside/);
    expect(() => conductivityAt25CNonLinear(500, -0.5)).toThrow(RangeError);
    expect(() => conductivityAt25CNonLinear(-500, 22)).toThrow(RangeError);
  });
});

describe("conductivityAt25C at the edge of its formula", () => {
  it("refuses a coefficient that makes 1 + α (T − 25) zero or negative", () => {
    // [derived] 1 + 0.04 × (0 − 25) = 0
    expect(() => conductivityAt25C(500, 0, 0.04)).toThrow(/undefined/);
  });
});
