import { describe, expect, it } from "vitest";
import type { SpecForOutcome } from "@/lib/evidence/outcome";
import {
  keyResult,
  lastOfEachType,
  trendChartData,
  trendOf,
  ZERO_LIMIT_SHARE,
  type KeyRunInput,
  type ResultPoint,
} from "@/lib/overview/key-result";
import {
  countOverdue,
  fromControlPlan,
  overdueStateLabel,
  sortOverdue,
  type OverdueTest,
} from "@/lib/overview/overdue";
import { landingPath, washerState, worstState, type WasherFacts } from "@/lib/overview/state";

const SPEC: SpecForOutcome = {
  ccc: "N(C-E1000/J-K0)",
  maxMetallicUm: null,
  maxNonMetallicUm: null,
  maxFibreUm: null,
  gravimetricLimitMg: 2,
  gravimetricBasis: "per_component",
  minWettingTensionMNm: 38,
};
const FAMILY = { wettedAreaCm2: 250, wettedVolumeCm3: null };
const run = (over: Partial<KeyRunInput>): KeyRunInput => ({
  testType: "gravimetric",
  family: FAMILY,
  spec: SPEC,
  conductivityLimitUsPerCm: null,
  samples: [],
  ...over,
});

describe("key value of a verified run", () => {
  it("gravimetric: the highest residue per component against the specification's limit", () => {
    const key = keyResult(
      run({
        samples: [
          // [derived] (16.40 − 10.00) mg / 4 components = 1.60 mg per component
          { data: { filterBeforeMg: 10, filterAfterMg: 16.4, components: 4 } },
          // [derived] (12.50 − 10.00) mg / 5 components = 0.50 mg per component
          { data: { filterBeforeMg: 10, filterAfterMg: 12.5, components: 5 } },
        ],
      }),
    );
    expect(key?.value).toBeCloseTo(1.6, 10);
    expect(key?.unit).toBe("mg per component");
    expect(key?.limit).toMatchObject({ kind: "spec", value: 2, side: "high" });
  });

  it("gravimetric per 1000 cm²: the residue over the tested area", () => {
    const key = keyResult(
      run({
        spec: { ...SPEC, gravimetricBasis: "per_1000_cm2" },
        // [derived] 5.00 mg over 4 × 250 cm² = 1000 cm² → 5.00 mg per 1000 cm²
        samples: [{ data: { filterBeforeMg: 10, filterAfterMg: 15, components: 4 } }],
      }),
    );
    expect(key?.value).toBeCloseTo(5, 10);
    expect(key?.unit).toBe("mg per 1000 cm²");
  });

  it("wetting tension: the lowest reading against the minimum, a lower limit", () => {
    const key = keyResult(
      run({
        testType: "wetting_tension",
        samples: [{ data: { readingsMNm: [44, 40, 46] } }, { data: { readingsMNm: [42] } }],
      }),
    );
    expect(key?.value).toBe(40); // [derived] the smallest of the readings
    expect(key?.limit).toMatchObject({ value: 38, side: "low" });
  });

  it("rinse conductivity: the highest reading compensated to 25 °C against the recipe's limit", () => {
    const key = keyResult(
      run({
        testType: "rinse_conductivity",
        conductivityLimitUsPerCm: 20,
        // [practice] linear compensation, α = 2 %/°C: 11 / (1 + 0.02 × (30 − 25)) = 10 µS/cm
        samples: [{ data: { measuredUsPerCm: 11, temperatureC: 30 } }],
      }),
    );
    expect(key?.value).toBeCloseTo(10, 10);
    expect(key?.limit?.value).toBe(20);
  });

  it("particle cleanliness: the worst size class of the worst sample as a share of its limit", () => {
    const key = keyResult(
      run({
        testType: "particle_cleanliness",
        // [derived] N() counts per component: (400 + 300 + 100) / 2 components = 400 ≤ 1000 → 40 %
        samples: [{ data: { components: 2, counts: { C: 400, D: 300, E: 100 } } }],
      }),
    );
    expect(key?.value).toBeCloseTo(40, 10);
    expect(key?.limit).toMatchObject({ value: 100, side: "high" });
    expect(key?.atLeast).toBeUndefined();
  });

  it("particle cleanliness: a particle in a class allowed none is beyond the limit, read 'at least'", () => {
    const key = keyResult(
      run({
        testType: "particle_cleanliness",
        samples: [{ data: { components: 2, counts: { C: 10, J: 1 } } }],
      }),
    );
    expect(key?.value).toBe(ZERO_LIMIT_SHARE);
    expect(key?.atLeast).toBe(true);
  });

  it("has no number for observed tests, and no throw for rows that no longer read", () => {
    expect(keyResult(run({ testType: "visual", samples: [{ data: {} }] }))).toBeNull();
    expect(
      keyResult(
        run({
          testType: "particle_cleanliness",
          spec: { ...SPEC, ccc: "not a code" },
          samples: [{ data: { components: 1, counts: { C: 1 } } }],
        }),
      ),
    ).toBeNull();
  });
});

const point = (over: Partial<ResultPoint>): ResultPoint => ({
  runId: over.run ?? "r",
  run: "TR-1",
  at: "2026-01-01",
  testType: "particle_cleanliness",
  outcome: "pass",
  key: null,
  ...over,
});
const gravKey = (value: number) => ({
  value,
  unit: "mg per component",
  label: "highest residue",
  limit: { kind: "spec" as const, label: "limit 2", value: 2, side: "high" as const },
});

describe("trend of a washer × part family", () => {
  it("draws the first measured test type in order, oldest run first", () => {
    const points = [
      point({ run: "TR-3", at: "2026-03-01", testType: "gravimetric", key: gravKey(1) }),
      point({ run: "TR-1", at: "2026-01-01", testType: "gravimetric", key: gravKey(0.5) }),
      point({ run: "TR-2", at: "2026-02-01", testType: "visual" }),
    ];
    const trend = trendOf(points);
    expect(trend?.testType).toBe("gravimetric");
    expect(trend?.points.map((p) => p.run)).toEqual(["TR-1", "TR-3"]);
    expect(trendOf([point({ testType: "visual" })])).toBeNull();
  });

  it("lists the newest result of each test type", () => {
    const last = lastOfEachType([
      point({ run: "TR-1", at: "2026-01-01", testType: "gravimetric" }),
      point({ run: "TR-2", at: "2026-02-01", testType: "gravimetric" }),
      point({ run: "TR-3", at: "2026-01-15", testType: "visual" }),
    ]);
    expect(last.map((p) => p.run)).toEqual(["TR-2", "TR-3"]);
  });

  it("holds the specification limit on the axis however far below it the results lie", () => {
    // Residues of 0.10–0.20 mg against a 2 mg limit: an axis fitted to the data would end near 0.2.
    const chart = trendChartData(
      trendOf([
        point({ run: "TR-1", at: "2026-01-01", testType: "gravimetric", key: gravKey(0.1) }),
        point({ run: "TR-2", at: "2026-02-01", testType: "gravimetric", key: gravKey(0.2) }),
      ]),
    )!;
    expect(chart.domain[0]).toBeLessThanOrEqual(0.1);
    expect(chart.domain[1]).toBeGreaterThanOrEqual(2);
    expect(chart.limits.map((l) => l.label)).toEqual(["limit 2"]);
    expect(chart.points.every((p) => p.beyond === null)).toBe(true);
  });

  it("holds a lower limit above every reading and names the points beyond it", () => {
    const low = (value: number) => ({
      value,
      unit: "mN/m",
      label: "lowest reading",
      limit: { kind: "spec" as const, label: "minimum 38", value: 38, side: "low" as const },
    });
    const chart = trendChartData(
      trendOf([
        point({ run: "TR-1", at: "2026-01-01", testType: "wetting_tension", key: low(30) }),
        point({ run: "TR-2", at: "2026-02-01", testType: "wetting_tension", key: low(32) }),
      ]),
    )!;
    expect(chart.domain[0]).toBeLessThanOrEqual(30);
    expect(chart.domain[1]).toBeGreaterThanOrEqual(38);
    expect(chart.points.map((p) => p.beyond)).toEqual(["beyond minimum 38", "beyond minimum 38"]);
  });
});

const facts = (over: Partial<WasherFacts> = {}): WasherFacts => ({
  tanks: [],
  checks: [],
  lastResults: [],
  requalifications: [],
  openNonconformances: 0,
  activeDeviations: 0,
  overdueEmergencies: 0,
  awaitingEmergencies: 0,
  ...over,
});

describe("washer state in words", () => {
  it("is in order with nothing open, near or beyond", () => {
    expect(
      washerState(
        facts({
          tanks: [{ name: "Wash", state: "ok" }],
          checks: [{ name: "Filter change", state: "ok" }],
        }),
      ),
    ).toEqual({ state: "in_order", reasons: [] });
  });

  it("needs attention for an action limit, a check due or an open record", () => {
    const s = washerState(
      facts({
        tanks: [{ name: "Wash", state: "action" }],
        checks: [{ name: "Nozzle check", state: "due" }],
        openNonconformances: 2,
      }),
    );
    expect(s.state).toBe("attention");
    expect(s.reasons).toEqual([
      "Wash: beyond action limit",
      "Nozzle check: due",
      "2 open nonconformances",
    ]);
  });

  it("needs action for a reject limit, a failed result, anything overdue; worst reasons first", () => {
    const s = washerState(
      facts({
        tanks: [{ name: "Wash", state: "action" }],
        lastResults: [{ name: "PF-1 Gravimetric residue", outcome: "fail" }],
        requalifications: [{ name: "R-1 v2 × PF-1", state: "overdue" }],
        overdueEmergencies: 1,
      }),
    );
    expect(s.state).toBe("action");
    expect(s.reasons).toEqual([
      "PF-1 Gravimetric residue: last verified result failed",
      "R-1 v2 × PF-1: requalification overdue",
      "1 emergency change past approval date",
      "Wash: beyond action limit",
    ]);
    expect(washerState(facts({ tanks: [{ name: "Rinse", state: "reject" }] })).state).toBe(
      "action",
    );
  });

  it("takes the worst washer's state for the plant", () => {
    expect(worstState(["in_order", "attention"])).toBe("attention");
    expect(worstState(["attention", "action", "in_order"])).toBe("action");
    expect(worstState([])).toBe("in_order");
  });
});

describe("overdue tests", () => {
  const item = (over: Partial<OverdueTest>): OverdueTest => ({
    source: "equipment_check",
    systemId: "s",
    recipeVersionId: null,
    partFamilyId: null,
    characteristic: "Nozzle check",
    subject: "AW-3 · Wash",
    dueAt: "2026-05-01T00:00:00.000Z",
    state: "due",
    href: "/evidence/bath/x",
    ...over,
  });

  it("lists overdue before due, oldest date first, and counts each", () => {
    const sorted = sortOverdue([
      item({ characteristic: "A", dueAt: "2026-04-01T00:00:00.000Z", state: "due" }),
      item({ characteristic: "B", dueAt: "2026-06-01T00:00:00.000Z", state: "overdue" }),
      item({ characteristic: "C", dueAt: "2026-03-01T00:00:00.000Z", state: "overdue" }),
    ]);
    expect(sorted.map((i) => i.characteristic)).toEqual(["C", "B", "A"]);
    expect(countOverdue(sorted)).toEqual({ overdue: 2, due: 1 });
  });

  it("takes control-plan due tests, named by their combination, leaving those not yet due", () => {
    const rows = fromControlPlan(
      [
        {
          systemId: "s1",
          recipeVersionId: "v1",
          partFamilyId: "f1",
          characteristic: "Particle cleanliness",
          dueAt: "2026-05-01T06:00:00.000Z",
          state: "overdue",
        },
        {
          systemId: "s1",
          recipeVersionId: "v1",
          partFamilyId: "f1",
          characteristic: "Wetting tension",
          dueAt: "2026-06-01T06:00:00.000Z",
          state: "scheduled",
        },
      ],
      [
        {
          recipeVersionId: "v1",
          familyId: "f1",
          recipeId: "r1",
          recipeCode: "R-AW3-VB",
          version: 2,
          familyCode: "PF-VB-210",
        },
      ],
    );
    expect(rows).toEqual([
      {
        source: "control_plan",
        systemId: "s1",
        recipeVersionId: "v1",
        partFamilyId: "f1",
        characteristic: "Particle cleanliness",
        subject: "R-AW3-VB v2 × PF-VB-210",
        dueAt: "2026-05-01T06:00:00.000Z",
        state: "overdue",
        href: "/systems/recipes/r1",
      },
    ]);
  });

  it("links a control-plan test to its plan and leaves one whose cycle count is not reached", () => {
    const base = { systemId: "s1", recipeVersionId: "v1", partFamilyId: "f1", state: "due" };
    const rows = fromControlPlan(
      [
        { ...base, characteristic: "Residue mass", dueAt: null, href: "/control-plans/p1" },
        {
          ...base,
          characteristic: "Dryness",
          dueAt: "2026-05-02T06:00:00.000Z",
          href: "/control-plans/p1",
        },
      ],
      [],
    );
    expect(rows.map((r) => [r.characteristic, r.subject, r.href])).toEqual([
      ["Dryness", "Qualified combination", "/control-plans/p1"],
    ]);
  });
});

describe("the overdue list's state in words", () => {
  it("says a test whose date has passed but is not yet overdue is due now, not soon", () => {
    const now = new Date("2026-12-03T06:00:00.000Z");
    expect(overdueStateLabel({ state: "due", dueAt: "2026-11-28T06:00:00.000Z" }, now)).toBe(
      "Due now",
    );
    expect(overdueStateLabel({ state: "due", dueAt: "2026-12-15T06:00:00.000Z" }, now)).toBe(
      "Due soon",
    );
    expect(overdueStateLabel({ state: "overdue", dueAt: "2026-11-01T06:00:00.000Z" }, now)).toBe(
      "Overdue",
    );
  });
});

describe("landing page after sign-in", () => {
  it("sends engineers and administrators to the overview, technicians to My queue", () => {
    expect(landingPath(["engineer"])).toBe("/overview");
    expect(landingPath(["admin"])).toBe("/overview");
    expect(landingPath(["technician", "engineer"])).toBe("/overview");
    expect(landingPath(["technician"])).toBe("/queue");
    expect(landingPath(["approver"])).toBe("/queue");
    // Auditors have no queue: they keep landing on the cleaning systems.
    expect(landingPath(["auditor"])).toBe("/systems");
  });
});
