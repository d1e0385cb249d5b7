import { describe, expect, it } from "vitest";
import { assess, raiseProblem } from "@/lib/changes/assess";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import {
  DEFAULT_MATRIX,
  requiredTests,
  samplesFor,
  type MatrixRow,
} from "@/lib/changes/requalification";
import { dueState, requalificationDue } from "@/lib/changes/periodic";

const base: RecipeSnapshot = {
  detergent: "Alkaline cleaner AC-14",
  notes: null,
  stages: [
    {
      name: "Wash",
      kind: "wash",
      mode: "ultrasonic",
      parameters: [
        {
          key: "wash.temperature",
          name: "Bath temperature",
          kind: "temperature",
          setpoint: 60,
          unit: "°C",
          validatedLow: 50,
          validatedHigh: 65,
          critical: true,
        },
        {
          key: "wash.concentration",
          name: "Detergent concentration",
          kind: "concentration",
          setpoint: 3,
          unit: "%",
          validatedLow: 2,
          validatedHigh: 4,
          critical: true,
        },
      ],
    },
    {
      name: "Final rinse",
      kind: "final_rinse",
      mode: "spray",
      parameters: [
        {
          key: "final_rinse.conductivity_limit",
          name: "Conductivity limit",
          kind: "conductivity_limit",
          setpoint: 10,
          unit: "µS/cm",
          validatedLow: 0,
          validatedHigh: 20,
          critical: true,
        },
      ],
    },
    {
      name: "Drying",
      kind: "drying",
      mode: "vacuum_drying",
      parameters: [
        {
          key: "drying.temperature",
          name: "Drying temperature",
          kind: "drying_temperature",
          setpoint: 110,
          unit: "°C",
          validatedLow: 100,
          validatedHigh: 120,
          critical: true,
        },
      ],
    },
    {
      name: "Loading",
      kind: "other",
      mode: null,
      parameters: [
        {
          key: "loading.parts",
          name: "Parts per basket",
          kind: "basket_loading",
          setpoint: 24,
          unit: "parts/basket",
          validatedLow: 12,
          validatedHigh: 24,
          critical: true,
        },
      ],
    },
  ],
};
const withParam = (key: string, patch: object): RecipeSnapshot => ({
  ...base,
  stages: base.stages.map((s) => ({
    ...s,
    parameters: s.parameters.map((p) => (p.key === key ? { ...p, ...patch } : p)),
  })),
});
const run = (to: RecipeSnapshot, extra: Partial<Parameters<typeof assess>[0]> = {}) =>
  assess({ from: base, to, newPartFamily: null, raisedTo: null, matrix: DEFAULT_MATRIX, ...extra });
const tests = (a: ReturnType<typeof assess>) => a.tests.map((t) => `${t.testType}×${t.samples}`);

describe("sample size from confidence and reliability (success-run theorem)", () => {
  // Check values [derived, standards.md §4]: 95/90 → 29; 95/95 → 59; 95/99 → 299.
  it.each([
    [95, 90, 29],
    [95, 95, 59],
    [95, 99, 299],
  ])("C %d %% / R %d %% → %d parts", (c, r, n) =>
    expect(samplesFor({ confidencePct: c, reliabilityPct: r })).toBe(n),
  );
});

describe("matrix → required tests", () => {
  const table: {
    name: string;
    to: RecipeSnapshot;
    extra?: Partial<Parameters<typeof assess>[0]>;
    impact: string;
    tests: string[];
  }[] = [
    {
      name: "wash temperature inside its range",
      to: withParam("wash.temperature", { setpoint: 64 }),
      impact: "minor",
      tests: [],
    },
    {
      name: "wash temperature above its range (thermal)",
      to: withParam("wash.temperature", { setpoint: 70 }),
      impact: "major",
      tests: ["gravimetric×29", "particle_cleanliness×29"],
    },
    {
      name: "concentration range widened (chemical)",
      to: withParam("wash.concentration", { validatedHigh: 6 }),
      impact: "major",
      tests: ["gravimetric×29", "particle_cleanliness×29"],
    },
    {
      name: "rinse conductivity limit outside (final rinse water quality)",
      to: withParam("final_rinse.conductivity_limit", { setpoint: 30 }),
      impact: "major",
      tests: ["gravimetric×29", "visual×29"],
    },
    {
      name: "drying temperature outside (drying)",
      to: withParam("drying.temperature", { setpoint: 130 }),
      impact: "major",
      tests: ["dryness×29", "visual×29"],
    },
    {
      name: "basket loading above its range (loading)",
      to: withParam("loading.parts", { setpoint: 30 }),
      impact: "major",
      tests: ["particle_cleanliness×29"],
    },
    {
      name: "a new detergent",
      to: { ...base, detergent: "Neutral cleaner NC-7" },
      impact: "major",
      tests: ["gravimetric×29", "particle_cleanliness×29"],
    },
    {
      name: "drying mode changed",
      to: {
        ...base,
        stages: base.stages.map((s) =>
          s.kind === "drying" ? { ...s, mode: "hot_air_drying" } : s,
        ),
      },
      impact: "major",
      tests: ["dryness×29", "visual×29"],
    },
    {
      name: "a new part family on the recipe",
      to: base,
      extra: { newPartFamily: "PF-X" },
      impact: "major",
      tests: ["dryness×29", "gravimetric×29", "particle_cleanliness×29", "visual×29"],
    },
    {
      name: "raised to major by judgement",
      to: withParam("wash.temperature", { setpoint: 62 }),
      extra: { raisedTo: "major" },
      impact: "major",
      tests: ["gravimetric×29", "particle_cleanliness×29"],
    },
  ];
  it.each(table)("$name → $impact, $tests", ({ to, extra, impact, tests: expected }) => {
    const a = run(to, extra);
    expect(a.impact).toBe(impact);
    expect(tests(a)).toEqual(expected);
  });

  it("where two rows ask for the same test, the larger sample holds and both reasons are kept", () => {
    const matrix: MatrixRow[] = [
      {
        subject: "parameter:temperature",
        testType: "particle_cleanliness",
        confidencePct: 95,
        reliabilityPct: 90,
      },
      {
        subject: "detergent",
        testType: "particle_cleanliness",
        confidencePct: 95,
        reliabilityPct: 95,
      },
    ];
    const r = requiredTests(
      [
        { subject: "parameter:temperature", reason: "hotter" },
        { subject: "detergent", reason: "new detergent" },
      ],
      matrix,
    );
    expect(r).toEqual([
      {
        testType: "particle_cleanliness",
        samples: 59,
        confidencePct: 95,
        reliabilityPct: 95,
        // Neither row states its cycles: the default of three distinct cycles holds.
        minCycles: 3,
        because: ["hotter", "new detergent"],
      },
    ]);
  });

  it("asks for the most distinct cycles any calling row states", () => {
    const r = requiredTests(
      [
        { subject: "parameter:temperature", reason: "hotter" },
        { subject: "detergent", reason: "new detergent" },
      ],
      [
        {
          subject: "parameter:temperature",
          testType: "gravimetric",
          confidencePct: 90,
          reliabilityPct: 90,
          minCycles: 5,
        },
        {
          subject: "detergent",
          testType: "gravimetric",
          confidencePct: 90,
          reliabilityPct: 90,
          minCycles: 2,
        },
      ],
    );
    expect(r[0].minCycles).toBe(5);
  });

  it("the engineer may raise the class but never lower it", () => {
    expect(raiseProblem("major", "minor")).toMatch(/never lowered/);
    expect(raiseProblem("minor", "major")).toBeNull();
    expect(raiseProblem("minor", null)).toBeNull();
  });
});

describe("periodic requalification", () => {
  it("falls due after the interval, clamping to the month's end", () => {
    expect(requalificationDue("2025-03-10T07:00:00.000Z", 12)).toBe("2026-03-10T07:00:00.000Z");
    expect(requalificationDue("2025-01-31T00:00:00.000Z", 1)).toBe("2025-02-28T00:00:00.000Z");
  });
  it("is due within 30 days, overdue after, and not due before", () => {
    const now = new Date("2026-03-01T00:00:00.000Z");
    expect(dueState("2026-03-20T00:00:00.000Z", now)).toBe("due_soon");
    expect(dueState("2026-02-20T00:00:00.000Z", now)).toBe("overdue");
    expect(dueState("2026-05-01T00:00:00.000Z", now)).toBe("not_due");
  });
});
