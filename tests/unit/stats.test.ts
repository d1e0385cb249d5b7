import fc from "fast-check";
import { binomialDistribution, mean, sampleStandardDeviation } from "simple-statistics";
import { describe, expect, it } from "vitest";
import {
  capability,
  D2_N2,
  D4_N2,
  individualsChart,
  StatsInputError,
  successRunSampleSize,
} from "@/lib/stats";

// Check values carry their source and tag as in ../shared/reference/standards.md.

/** P(at most f failures in n trials, each failing with probability 1 − R), from simple-statistics. */
function referenceCdf(n: number, reliability: number, failures: number): number {
  const cells = binomialDistribution(n, 1 - reliability);
  if (cells === undefined) throw new Error(`no reference distribution for n = ${n}`);
  let sum = 0;
  for (let k = 0; k <= failures && k < cells.length; k++) sum += cells[k];
  return sum;
}

describe("successRunSampleSize", () => {
  it("matches the success-run check values", () => {
    // [derived] standards.md §4: n = ln(1 − C) / ln(R) rounded up
    expect(successRunSampleSize(0.95, 0.9)).toBe(29);
    expect(successRunSampleSize(0.95, 0.95)).toBe(59);
    expect(successRunSampleSize(0.95, 0.99)).toBe(299);
    // [derived] same formula: 99 % confidence, 95 % reliability → ln(0.01)/ln(0.95) = 89.8 → 90
    expect(successRunSampleSize(0.99, 0.95)).toBe(90);
  });

  it("lands exactly on a whole-number solution instead of one above it", () => {
    // [derived] 0.5² = 0.25 = 1 − 0.75: two successes give 75 % confidence of R ≥ 50 %
    expect(successRunSampleSize(0.75, 0.5)).toBe(2);
  });

  it("grows with the failures allowed, by the binomial distribution", () => {
    // [memory] attribute sampling tables for one failure allowed: 95/90 → 46, 95/95 → 93,
    // 90/90 → 38; [derived] each confirmed below against the binomial distribution
    expect(successRunSampleSize(0.95, 0.9, 1)).toBe(46);
    expect(successRunSampleSize(0.95, 0.95, 1)).toBe(93);
    expect(successRunSampleSize(0.9, 0.9, 1)).toBe(38);
    expect(successRunSampleSize(0.95, 0.9, 2)).toBe(61);
    for (const [c, r, f, n] of [
      [0.95, 0.9, 1, 46],
      [0.95, 0.95, 1, 93],
      [0.9, 0.9, 1, 38],
      [0.95, 0.9, 2, 61],
    ]) {
      expect(referenceCdf(n, r, f)).toBeLessThanOrEqual(1 - c);
      expect(referenceCdf(n - 1, r, f)).toBeGreaterThan(1 - c);
    }
  });

  it("agrees with simple-statistics' binomial distribution on generated plans", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 0.995, noNaN: true }),
        fc.double({ min: 0.5, max: 0.995, noNaN: true }),
        fc.integer({ min: 0, max: 5 }),
        (c, r, f) => {
          const n = successRunSampleSize(c, r, f);
          const tolerance = 1e-9;
          return (
            referenceCdf(n, r, f) <= 1 - c + tolerance &&
            (n - 1 <= f || referenceCdf(n - 1, r, f) > 1 - c - tolerance)
          );
        },
      ),
      { numRuns: 300 },
    );
  });

  it("never falls as confidence or reliability rise (property)", () => {
    const probability = fc.double({ min: 0.01, max: 0.999, noNaN: true });
    fc.assert(
      fc.property(
        probability,
        probability,
        probability,
        fc.integer({ min: 0, max: 3 }),
        (c1, c2, r, f) => {
          const [low, high] = c1 <= c2 ? [c1, c2] : [c2, c1];
          return successRunSampleSize(low, r, f) <= successRunSampleSize(high, r, f);
        },
      ),
    );
    fc.assert(
      fc.property(
        probability,
        probability,
        probability,
        fc.integer({ min: 0, max: 3 }),
        (c, r1, r2, f) => {
          const [low, high] = r1 <= r2 ? [r1, r2] : [r2, r1];
          return successRunSampleSize(c, low, f) <= successRunSampleSize(c, high, f);
        },
      ),
    );
  });

  it("refuses confidence or reliability outside (0, 1) and bad failure counts", () => {
    expect(() => successRunSampleSize(0, 0.9)).toThrow(StatsInputError);
    expect(() => successRunSampleSize(1, 0.9)).toThrow(/strictly between 0 and 1/);
    expect(() => successRunSampleSize(0.95, 1)).toThrow(RangeError);
    expect(() => successRunSampleSize(0.95, -0.1)).toThrow(RangeError);
    expect(() => successRunSampleSize(Number.NaN, 0.9)).toThrow(RangeError);
    expect(() => successRunSampleSize(0.95, Number.POSITIVE_INFINITY)).toThrow(RangeError);
    expect(() => successRunSampleSize(0.95, 0.9, -1)).toThrow(/whole number/);
    expect(() => successRunSampleSize(0.95, 0.9, 1.5)).toThrow(RangeError);
    expect(() => successRunSampleSize(0.95, 0.9, 1001)).toThrow(/0 to 1000/);
    expect(() => successRunSampleSize(0.999999, 0.999999999)).toThrow(/exceeds/);
  });
});

describe("capability", () => {
  it("reproduces the textbook example", () => {
    // [std] Montgomery & Runger, Applied Statistics and Probability for Engineers, Ex. 16-3:
    // specification 100 ± 10, mean 107.0, σ 1.5 → Cp 2.22, Cpk 0.67
    const result = capability({ mean: 107, sigma: 1.5, lsl: 90, usl: 110 });
    expect(result.cp).toBeCloseTo(2.22, 2);
    expect(result.cpk).toBeCloseTo(0.67, 2);
    // [std] NIST Dataplot CPU/CPL definitions
    expect(result.cpu).toBeCloseTo(3 / 4.5, 12);
    expect(result.cpl).toBeCloseTo(17 / 4.5, 12);
  });

  it("handles one-sided limits", () => {
    // [derived] CPU = (USL − x̄) / 3σ; with one limit Cpk is that index and Cp is undefined
    const upper = capability({ mean: 107, sigma: 1.5, usl: 110 });
    expect(upper.cp).toBeUndefined();
    expect(upper.cpl).toBeUndefined();
    expect(upper.cpk).toBeCloseTo(0.6667, 4);
    const lower = capability({ mean: 12, sigma: 2, lsl: 6 });
    expect(lower.cpk).toBe(1);
  });

  it("uses the within σ (MR̄/d2) for Cpk and the overall σ for Ppk from raw values", () => {
    // [derived] values 10, 12, 11, 13, 12: x̄ 11.6; MR̄ 1.5 → σ_within 1.5/1.128 = 1.3298;
    // s = √(5.2/4) = 1.1402; LSL 8, USL 16 → Cp 1.0027, Cpk 0.9024, Pp 1.1694, Ppk 1.0525
    const result = capability({ values: [10, 12, 11, 13, 12], lsl: 8, usl: 16 });
    expect(result.mean).toBeCloseTo(11.6, 12);
    expect(result.sigma).toBeCloseTo(1.3298, 4);
    expect(result.sigmaOverall).toBeCloseTo(1.1402, 4);
    expect(result.cp).toBeCloseTo(1.0027, 4);
    expect(result.cpk).toBeCloseTo(0.9024, 4);
    expect(result.pp).toBeCloseTo(1.1694, 4);
    expect(result.ppk).toBeCloseTo(1.0525, 4);
  });

  it("agrees with simple-statistics on generated data", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1000, max: 1000, noNaN: true }), {
          minLength: 2,
          maxLength: 60,
        }),
        (values) => {
          fc.pre(new Set(values).size > 1);
          const m = mean(values);
          const s = sampleStandardDeviation(values);
          fc.pre(s > 1e-6);
          const lsl = m - 5;
          const usl = m + 7;
          const result = capability({ values, lsl, usl });
          const expectedPpk = Math.min((usl - m) / (3 * s), (m - lsl) / (3 * s));
          const close = (a: number, b: number) =>
            Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));
          return (
            close(result.mean, m) &&
            close(result.sigmaOverall!, s) &&
            close(result.ppk!, expectedPpk)
          );
        },
      ),
    );
  });

  it("refuses missing limits, crossed limits, zero σ and mixed input", () => {
    expect(() => capability({ mean: 1, sigma: 1 })).toThrow(/at least one specification limit/);
    expect(() => capability({ mean: 1, sigma: 1, lsl: 5, usl: 5 })).toThrow(/below USL/);
    expect(() => capability({ mean: 1, sigma: 0, usl: 5 })).toThrow(StatsInputError);
    expect(() => capability({ mean: 1, sigma: -1, usl: 5 })).toThrow(RangeError);
    expect(() => capability({ mean: Number.NaN, sigma: 1, usl: 5 })).toThrow(RangeError);
    expect(() => capability({ mean: 1, usl: 5 })).toThrow(/mean and σ/);
    expect(() => capability({ values: [1, 2], mean: 1, usl: 5 })).toThrow(/not both/);
    expect(() => capability({ values: [1], usl: 5 })).toThrow(/at least 2 values/);
    expect(() => capability({ values: [3, 3, 3], usl: 5 })).toThrow(/do not vary/);
    expect(() => capability({ values: [1, Number.POSITIVE_INFINITY], usl: 5 })).toThrow(RangeError);
  });
});

describe("individualsChart", () => {
  it("uses the n = 2 constants", () => {
    // [std] ASTM E2587 / NIST e-Handbook control chart tables: d2 = 1.128, D4 = 3.267
    expect(D2_N2).toBe(1.128);
    expect(D4_N2).toBe(3.267);
  });

  it("computes limits and flags points beyond them, runs of 8 and large moving ranges", () => {
    // [derived] 10, 11 ×4 alternating, then 20: x̄ 11.4, MR̄ 18/9 = 2, σ = 2/1.128 = 1.7730,
    // limits 11.4 ± 5.3191; MR limit 3.267 × 2 = 6.534
    const chart = individualsChart([10, 11, 10, 11, 10, 11, 10, 11, 10, 20]);
    expect(chart.individuals.centre).toBeCloseTo(11.4, 12);
    expect(chart.sigma).toBeCloseTo(1.773, 3);
    expect(chart.individuals.ucl).toBeCloseTo(16.7191, 4);
    expect(chart.individuals.lcl).toBeCloseTo(6.0809, 4);
    expect(chart.movingRange).toEqual({ centre: 2, ucl: 6.534, lcl: 0 });
    expect(chart.movingRanges).toEqual([1, 1, 1, 1, 1, 1, 1, 1, 10]);
    expect(chart.outOfControl.map((p) => [p.index, p.rule])).toEqual([
      [7, "run-of-8"],
      [8, "run-of-8"],
      [9, "beyond-limits"],
      [9, "moving-range-above-limit"],
    ]);
  });

  it("does not flag a run of 7, and a value on the centre line breaks a run", () => {
    const seven = individualsChart([1, 1, 1, 1, 1, 1, 1, 3, 3, 3, 3, 3, 3, 3]);
    expect(seven.outOfControl.filter((p) => p.rule === "run-of-8")).toEqual([]);
    const broken = individualsChart([1, 1, 1, 1, 2, 1, 1, 1, 1, 3, 3, 3]);
    // x̄ = 19/12 ≈ 1.583: the 2 is above it, so no run of 8 below
    expect(broken.outOfControl.filter((p) => p.rule === "run-of-8")).toEqual([]);
  });

  it("finds nothing out of control in a series with no variation", () => {
    // common practice: a process with no variation has σ = 0 and every reading on the centre line.
    // Twenty readings of 3.1 sum in floating point to a mean of 3.100000000000001 (from a bath
    // held at 3.1 % in the plant-size data), which had put each reading below limits zero apart.
    const flat = individualsChart(Array(20).fill(3.1));
    expect(flat.individuals).toEqual({ centre: 3.1, ucl: 3.1, lcl: 3.1 });
    expect(flat.outOfControl).toEqual([]);
    expect(individualsChart([0.1, 0.1, 0.1]).outOfControl).toEqual([]);
  });

  it("agrees with simple-statistics on generated data", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -1e4, max: 1e4, noNaN: true }), { minLength: 2, maxLength: 80 }),
        (values) => {
          const chart = individualsChart(values);
          const mr = values.slice(1).map((v, i) => Math.abs(v - values[i]));
          const mrBar = mean(mr);
          const close = (a: number, b: number) =>
            Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));
          return (
            close(chart.individuals.centre, mean(values)) &&
            close(chart.movingRange.centre, mrBar) &&
            close(chart.individuals.ucl, mean(values) + (3 * mrBar) / 1.128) &&
            chart.outOfControl
              .filter((p) => p.rule === "beyond-limits")
              .every((p) => p.value > chart.individuals.ucl || p.value < chart.individuals.lcl)
          );
        },
      ),
    );
  });

  it("refuses short or non-finite series", () => {
    expect(() => individualsChart([1])).toThrow(StatsInputError);
    expect(() => individualsChart([])).toThrow(/at least 2 values/);
    expect(() => individualsChart([1, Number.NaN])).toThrow(RangeError);
  });
});
