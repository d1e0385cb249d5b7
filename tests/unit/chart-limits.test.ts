import { describe, expect, it } from "vitest";
import { bathControlChart } from "@/lib/evidence/bath-chart";
import {
  labelNudges,
  roundAxis,
  countsSpanDecades,
  decadeAxis,
  beyondWords,
  chartDomain,
  pointBeyond,
  type ChartLimit,
} from "@/lib/evidence/chart-limits";

describe("chart domain", () => {
  it("extends the axis to a limit far outside the data, so its line is drawn", () => {
    // Readings around 3 % with a reject limit at 6 %: an axis fitted to the data would end near 3.2.
    const [low, high] = chartDomain([2.9, 3.0, 3.1], [{ value: 6 }, { value: 1 }]);
    expect(low).toBeLessThanOrEqual(1);
    expect(high).toBeGreaterThanOrEqual(6);
  });
  it("keeps every point in range when the limits are inside the data", () => {
    const [low, high] = chartDomain([10, 50, 90], [{ value: 40 }, { value: 60 }]);
    expect(low).toBeLessThan(10);
    expect(high).toBeGreaterThan(90);
  });
  it("does not draw below zero for positive data, and widens a flat series", () => {
    expect(chartDomain([0.1, 5], [])[0]).toBe(0);
    expect(chartDomain([4, 4], [])).toEqual([3.6, 4.4]);
    expect(chartDomain([], [])).toEqual([0, 1]);
    // One run that found no particle under a limit of zero (level 00): no negative counts.
    expect(chartDomain([0], [{ value: 0 }])).toEqual([0, 1]);
    // Negative values (a temperature below zero) keep their margin.
    expect(chartDomain([-10, 10], [])).toEqual([-11, 11]);
  });
});

describe("points beyond limits", () => {
  const limits: ChartLimit[] = [
    { kind: "target", label: "target 3", value: 3 },
    { kind: "action", label: "action low 2.5", value: 2.5 },
    { kind: "action", label: "action high 3.5", value: 3.5 },
    { kind: "reject", label: "reject high 4", value: 4 },
  ];
  it("names each limit a point lies beyond, worst first", () => {
    expect(pointBeyond(3.2, limits)).toEqual([]);
    const beyond = pointBeyond(4.2, limits);
    expect(beyond.map((l) => l.kind)).toEqual(["action", "reject"]);
    expect(beyondWords(beyond)).toBe("beyond reject high 4; beyond action high 3.5");
    expect(pointBeyond(2.4, limits).map((l) => l.label)).toEqual(["action low 2.5"]);
    expect(beyondWords([])).toBeNull();
  });
  it("uses the side a limit bounds when there is no target to read it from", () => {
    const band: ChartLimit[] = [
      { kind: "action", label: "action low 2.5", value: 2.5, side: "low" },
      { kind: "action", label: "action high 3.5", value: 3.5, side: "high" },
    ];
    expect(pointBeyond(3, band)).toEqual([]);
    expect(pointBeyond(2, band).map((l) => l.label)).toEqual(["action low 2.5"]);
  });
  it("reads a lone specification limit as a maximum", () => {
    expect(pointBeyond(120, [{ kind: "spec", label: "limit 100", value: 100 }])).toHaveLength(1);
    expect(pointBeyond(80, [{ kind: "spec", label: "limit 100", value: 100 }])).toHaveLength(0);
  });
});

describe("bath control chart", () => {
  const records = [2.9, 3.0, 3.1, 3.0, 4.3].map((v, i) => ({
    performedAt: `2026-06-0${i + 1}T08:00:00.000Z`,
    values: { concentrationPct: v },
  }));
  const plan = { target: 3, actionLow: 2.5, actionHigh: 3.5, rejectLow: 1, rejectHigh: 4 };
  it("draws the plan's limits with the statistical ones and a range holding all of them", () => {
    const chart = bathControlChart(records, "concentrationPct", plan)!;
    expect(chart.limits.map((l) => l.label)).toEqual([
      "target 3",
      "action low 2.5",
      "action high 3.5",
      "reject low 1",
      "reject high 4",
    ]);
    // The reject low at 1 % lies far below every reading: the axis still reaches it.
    expect(chart.domain[0]).toBeLessThanOrEqual(1);
    expect(chart.domain[1]).toBeGreaterThanOrEqual(Math.max(4.3, chart.ucl));
    const last = chart.points.at(-1)!;
    expect(last.beyondLimit).toBe("reject");
    expect(last.beyondWords).toBe("beyond reject high 4; beyond action high 3.5");
    expect(chart.points[0].beyondLimit).toBeNull();
  });
  it("still charts a value with no plan line, with its statistical limits only", () => {
    const chart = bathControlChart(records, "concentrationPct")!;
    expect(chart.limits).toEqual([]);
    expect(chart.domain[1]).toBeGreaterThanOrEqual(chart.ucl);
  });
});

// Label placement is our own layout rule (common practice: labels of a chart must not overprint).
describe("limit labels beside the plot", () => {
  const plot = 240; // px for a domain of 0..24: 10 px per unit
  it("leaves labels that are already apart on their lines", () => {
    expect(labelNudges([20, 10, 2], [0, 24], plot)).toEqual([0, 0, 0]);
  });
  it("moves the lower of two close labels down until they are the gap apart, keeping their order", () => {
    // UCL 3.42 and action limit 3.5 on a 0..24 axis: 0.8 px apart before.
    const nudges = labelNudges([3.42, 3.5], [0, 24], plot);
    const y = [3.42, 3.5].map((v, i) => ((24 - v) / 24) * plot + nudges[i]);
    expect(nudges[1]).toBe(0); // the upper one stays
    expect(y[0] - y[1]).toBeCloseTo(12, 9);
  });
  it("pushes a run of equal values down one gap each", () => {
    const nudges = labelNudges([5, 5, 5], [0, 10], 100, 12);
    expect(nudges).toEqual([0, 12, 24]);
  });
  it("does not divide by zero on a flat domain", () => {
    expect(labelNudges([1, 1], [1, 1], 100)).toEqual([0, 12]);
  });
});

// [practice] Round tick steps of 1, 2 or 5 × 10^k are common practice for chart axes.
describe("a y-axis on round numbers", () => {
  it("widens an axis that ended on odd values to round ones, with round ticks between", () => {
    expect(roundAxis([4510, 261690])).toEqual({
      domain: [0, 300000],
      ticks: [0, 50000, 100000, 150000, 200000, 250000, 300000],
    });
    expect(roundAxis([9.39, 10.04])).toEqual({
      domain: [9.2, 10.2],
      ticks: [9.2, 9.4, 9.6, 9.8, 10, 10.2],
    });
  });
  it("always holds the range it was given, on a step of 1, 2 or 5 times a power of ten", () => {
    for (const [low, high] of [
      [0, 1],
      [-11, 11],
      [2.85, 6.3],
      [0.0012, 0.0049],
      [3.6, 4.4],
    ] as const) {
      const axis = roundAxis([low, high]);
      expect(axis.domain[0]).toBeLessThanOrEqual(low);
      expect(axis.domain[1]).toBeGreaterThanOrEqual(high);
      const step = axis.ticks[1] - axis.ticks[0];
      const mantissa = step / 10 ** Math.floor(Math.log10(step));
      expect(
        [1, 2, 5].some((m) => Math.abs(mantissa - m) < 1e-9),
        `${low}..${high}`,
      ).toBe(true);
      expect(axis.ticks[0]).toBe(axis.domain[0]);
      expect(axis.ticks.at(-1)).toBe(axis.domain[1]);
    }
  });
});

// [std] Cleanliness levels are logarithmic: each level's upper bound about doubles the one below
// (ISO 16232:2018, table of cleanliness levels: 16, 32, 64, 130, 250, 500, 1,000 per 1,000 cm²).
describe("a logarithmic axis for particle counts", () => {
  it("is chosen when the counts and the limit span two decades or more", () => {
    // Level 7 (limit 130) against counts of 1 to 4: on a straight axis they lie along its foot.
    expect(countsSpanDecades([1, 2, 4], 130)).toBe(true);
    // Counts of 40 to 120 under the same limit read well on a straight axis.
    expect(countsSpanDecades([40, 80, 120], 130)).toBe(false);
    // A zero count is a real result but has no logarithm: the span is read from the others.
    expect(countsSpanDecades([0, 0, 1.5], 250)).toBe(true);
    expect(countsSpanDecades([0, 0], 250)).toBe(false);
    expect(countsSpanDecades([], 250)).toBe(false);
  });
  it("runs on powers of ten from the one at or below the lowest count to the one at or above the highest", () => {
    // Counts of 16,000 under a level-18 limit of 250,000: 10,000 to 1,000,000.
    expect(decadeAxis(16000, 250000)).toEqual({
      domain: [10000, 1000000],
      ticks: [10000, 100000, 1000000],
    });
    expect(decadeAxis(1, 130)).toEqual({ domain: [1, 1000], ticks: [1, 10, 100, 1000] });
    expect(decadeAxis(100, 1000)).toEqual({ domain: [100, 1000], ticks: [100, 1000] });
    // Fractions of a particle per 1,000 cm² reach down to their own power of ten.
    expect(decadeAxis(0.4, 130)).toEqual({ domain: [0.1, 1000], ticks: [0.1, 1, 10, 100, 1000] });
  });
  it("starts at zero when a run found no particle of the class", () => {
    expect(decadeAxis(0, 130)).toEqual({ domain: [0, 1000], ticks: [0, 1, 10, 100, 1000] });
    expect(decadeAxis(0, 0)).toEqual({ domain: [0, 1], ticks: [0, 1] });
  });
});
