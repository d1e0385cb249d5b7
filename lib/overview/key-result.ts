import type { Outcome, TestType } from "@/db/enums";
import { evaluateAgainstSpec, gravimetricResidue, parseCleanlinessSpec } from "@/lib/cleanliness";
import {
  beyondWords,
  chartDomain,
  pointBeyond,
  type ChartLimit,
} from "@/lib/evidence/chart-limits";
import type { SpecForOutcome } from "@/lib/evidence/outcome";
import { basisOf } from "@/lib/evidence/outcomes/particle";
import { formatNumber } from "@/lib/format/number";
import { conductivityAt25C } from "@/lib/water";

/** One verified run as the overview reads it: its stored rows and the limits that judged it. */
export interface KeyRunInput {
  testType: TestType;
  family: { wettedAreaCm2: number; wettedVolumeCm3: number | null };
  spec: SpecForOutcome;
  conductivityLimitUsPerCm: number | null;
  samples: { data: unknown }[];
}

/**
 * The one number a run is judged by, as a quality manager scans it: the worst sample against the
 * limit that decides it. Null when the test type has no number (visual, UV, dryness) or its data
 * cannot be read.
 */
export interface KeyResult {
  value: number;
  unit: string;
  /** What the number is, e.g. "highest residue". */
  label: string;
  /** The specification (or recipe) limit the value is judged against, drawn on the trend. */
  limit: ChartLimit | null;
  /** The value is a floor, not a measurement: "at least" (a share of a zero limit, see particleKey). */
  atLeast?: true;
}

const fmt = (n: number) => formatNumber(n, 2);

/** Where a count in a class whose limit is zero is drawn: beyond the limit, on the chart. */
export const ZERO_LIMIT_SHARE = 200;

/**
 * Particle cleanliness has a limit per size class, so no single count stands for the run: the
 * trend shows the worst class of the worst sample as a share of its own limit (100 % is the
 * limit), computed with evaluateAgainstSpec as the run's outcome is. Level-coded limits are
 * compared by their normalised count, as the outcome compares them.
 */
function particleKey(input: KeyRunInput): KeyResult | null {
  const spec = parseCleanlinessSpec(input.spec.ccc);
  let worst: number | null = null;
  let beyondZero = false;
  for (const s of input.samples) {
    const data = s.data as { components?: number; counts?: Record<string, number> } | null;
    if (!data?.counts || !data.components) continue;
    const basis = basisOf(spec.basis, data.components, input.family);
    if (!basis) continue;
    for (const row of evaluateAgainstSpec(data.counts, basis, spec).rows) {
      // A zero limit (no particle of that class allowed) has no share: any count is beyond it.
      if (row.limit <= 0 && row.value > 0) beyondZero = true;
      const share = row.limit > 0 ? (row.value / row.limit) * 100 : 0;
      worst = Math.max(worst ?? 0, share);
    }
  }
  if (worst === null) return null;
  const limit: ChartLimit = { kind: "spec", label: "limit 100 %", value: 100, side: "high" };
  // Particles in a class allowed none are beyond the limit by any share: drawn at twice the
  // limit (or the worst share, when higher) and read "at least".
  if (beyondZero && worst < ZERO_LIMIT_SHARE)
    return {
      value: ZERO_LIMIT_SHARE,
      unit: "% of limit",
      label: "worst size class",
      limit,
      atLeast: true,
    };
  return { value: worst, unit: "% of limit", label: "worst size class", limit };
}

function gravimetricKey(input: KeyRunInput): KeyResult | null {
  const perArea = input.spec.gravimetricBasis === "per_1000_cm2";
  let worst: number | null = null;
  for (const s of input.samples) {
    const d = s.data as {
      filterBeforeMg: number;
      filterAfterMg: number;
      blankMg?: number;
      components: number;
    } | null;
    if (!d || !(d.components > 0)) continue;
    const r = gravimetricResidue({
      filterBeforeMg: d.filterBeforeMg,
      filterAfterMg: d.filterAfterMg,
      blankMg: d.blankMg,
      components: d.components,
      totalAreaCm2: d.components * input.family.wettedAreaCm2,
    });
    const value = perArea ? r.per1000Cm2Mg : r.perComponentMg;
    if (typeof value === "number" && Number.isFinite(value)) worst = Math.max(worst ?? 0, value);
  }
  if (worst === null) return null;
  const unit = perArea ? "mg per 1000 cm²" : "mg per component";
  const limit = input.spec.gravimetricLimitMg;
  return {
    value: worst,
    unit,
    label: "highest residue",
    limit:
      limit === null
        ? null
        : { kind: "spec", label: `limit ${fmt(limit)}`, value: limit, side: "high" },
  };
}

function wettingKey(input: KeyRunInput): KeyResult | null {
  let lowest: number | null = null;
  for (const s of input.samples) {
    const readings = (s.data as { readingsMNm?: number[] } | null)?.readingsMNm ?? [];
    for (const r of readings) if (Number.isFinite(r)) lowest = Math.min(lowest ?? r, r);
  }
  if (lowest === null) return null;
  const min = input.spec.minWettingTensionMNm;
  return {
    value: lowest,
    unit: "mN/m",
    label: "lowest reading",
    limit:
      min === null ? null : { kind: "spec", label: `minimum ${fmt(min)}`, value: min, side: "low" },
  };
}

function conductivityKey(input: KeyRunInput): KeyResult | null {
  let highest: number | null = null;
  for (const s of input.samples) {
    const d = s.data as { measuredUsPerCm?: number; temperatureC?: number } | null;
    if (typeof d?.measuredUsPerCm !== "number" || typeof d.temperatureC !== "number") continue;
    // Compensated to 25 °C as the run's outcome compares it (lib/evidence/outcomes/rinse-conductivity).
    const k25 = conductivityAt25C(d.measuredUsPerCm, d.temperatureC);
    highest = Math.max(highest ?? k25, k25);
  }
  if (highest === null) return null;
  const limit = input.conductivityLimitUsPerCm;
  return {
    value: highest,
    unit: "µS/cm at 25 °C",
    label: "highest reading",
    limit:
      limit === null
        ? null
        : { kind: "spec", label: `limit ${fmt(limit)}`, value: limit, side: "high" },
  };
}

const KEYS: Partial<Record<TestType, (input: KeyRunInput) => KeyResult | null>> = {
  particle_cleanliness: particleKey,
  gravimetric: gravimetricKey,
  wetting_tension: wettingKey,
  rinse_conductivity: conductivityKey,
};

/** The key value of a run, or null (no number for its test type, or data that cannot be read). */
export function keyResult(input: KeyRunInput): KeyResult | null {
  const key = KEYS[input.testType];
  if (!key) return null;
  try {
    return key(input);
  } catch {
    // Stored rows were validated when written; a row that no longer reads shows as "no value", never a throw on the overview.
    return null;
  }
}

/** The test type whose trend a washer × part family tile draws: particle first, then the other measured ones. */
export const TREND_ORDER: readonly TestType[] = [
  "particle_cleanliness",
  "gravimetric",
  "wetting_tension",
  "rinse_conductivity",
];

export interface ResultPoint {
  runId: string;
  run: string;
  at: string;
  testType: TestType;
  outcome: Outcome | null;
  key: KeyResult | null;
}

/** The runs of the trend: those of the first test type in TREND_ORDER that has at least one value, oldest first. */
export function trendOf(points: readonly ResultPoint[]): {
  testType: TestType;
  points: (ResultPoint & { key: KeyResult })[];
} | null {
  for (const type of TREND_ORDER) {
    const withValue = points.filter(
      (p): p is ResultPoint & { key: KeyResult } => p.testType === type && p.key !== null,
    );
    if (withValue.length > 0)
      return {
        testType: type,
        points: [...withValue].sort((a, b) => (a.at < b.at ? -1 : a.at > b.at ? 1 : 0)),
      };
  }
  return null;
}

/** The newest result of each test type, newest first: what "last results" lists. */
export function lastOfEachType(points: readonly ResultPoint[]): ResultPoint[] {
  const seen = new Map<TestType, ResultPoint>();
  for (const p of [...points].sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : 0)))
    if (!seen.has(p.testType)) seen.set(p.testType, p);
  return [...seen.values()];
}

export interface TrendChartData {
  testType: TestType;
  unit: string;
  label: string;
  limits: ChartLimit[];
  /** Holds every point and every limit line (chartDomain), so a limit far from the data is drawn. */
  domain: [number, number];
  points: {
    runId: string;
    run: string;
    at: string;
    value: number;
    outcome: Outcome | null;
    /** The limits the point lies beyond, in words; null within them. */
    beyond: string | null;
  }[];
}

/** A tile's trend, ready to draw: its limit lines, a y-range that holds them and the points beyond them by name. */
export function trendChartData(trend: ReturnType<typeof trendOf>): TrendChartData | null {
  if (!trend || trend.points.length === 0) return null;
  const newest = trend.points[trend.points.length - 1].key;
  // The newest run's limit stands for the tile; a revised specification's older limits differ only in value.
  const limits = newest.limit ? [newest.limit] : [];
  return {
    testType: trend.testType,
    unit: newest.unit,
    label: newest.label,
    limits,
    domain: chartDomain(
      trend.points.map((p) => p.key.value),
      limits,
    ),
    points: trend.points.map((p) => ({
      runId: p.runId,
      run: p.run,
      at: p.at,
      value: p.key.value,
      outcome: p.outcome,
      beyond: beyondWords(pointBeyond(p.key.value, p.key.limit ? [p.key.limit] : [])),
    })),
  };
}
