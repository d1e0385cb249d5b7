import { nice, ticks } from "d3-array";

/** A horizontal line on a chart: a specification, action, reject or statistical limit, or a centre line. */
export interface ChartLimit {
  kind: "spec" | "action" | "reject" | "control" | "centre" | "target";
  /** Shown beside the line, e.g. "Reject high 3.5". */
  label: string;
  value: number;
  /** Which side the line bounds, where known; otherwise read from the target or centre line. */
  side?: "low" | "high";
}

export const LIMIT_KIND_WORDS: Record<ChartLimit["kind"], string> = {
  spec: "specification limit",
  action: "action limit",
  reject: "reject limit",
  control: "control limit",
  centre: "centre line",
  target: "target",
};

/**
 * The y-axis range that holds every point and every limit line, with a margin of 5 % of the span
 * on each side, so a limit far from the data is still drawn (an "auto" axis fits the data only and
 * the line silently falls off the chart). A flat series gets ±10 % around its value, or 0 to 1
 * when that value is zero.
 */
export function chartDomain(values: number[], limits: { value: number }[]): [number, number] {
  const all = [...values, ...limits.map((l) => l.value)].filter(Number.isFinite);
  if (all.length === 0) return [0, 1];
  let low = Math.min(...all);
  let high = Math.max(...all);
  if (low === high) {
    const pad = low === 0 ? 1 : Math.abs(low) * 0.1;
    // A run of zero counts under a limit of zero: from 0 up, never below.
    return [low === 0 ? 0 : low - pad, high + pad];
  }
  const margin = (high - low) * 0.05;
  // Counts and concentrations never go negative: don't draw an axis below zero for them.
  low = low >= 0 && low - margin < 0 ? 0 : low - margin;
  high = high + margin;
  return [low, high];
}

/**
 * Which limits a point lies beyond: above an upper line of its kind or below a lower one. Limits
 * come in pairs per kind around the centre of the data; a single limit of a kind (a specification
 * maximum) is read as an upper limit unless it lies below the target or centre line.
 */
export function pointBeyond(value: number, limits: ChartLimit[]): ChartLimit[] {
  const middle =
    limits.find((l) => l.kind === "target")?.value ??
    limits.find((l) => l.kind === "centre")?.value;
  const out: ChartLimit[] = [];
  for (const l of limits) {
    if (l.kind === "centre" || l.kind === "target") continue;
    const isLower = l.side ? l.side === "low" : middle !== undefined ? l.value < middle : false;
    if (isLower ? value < l.value : value > l.value) out.push(l);
  }
  return out;
}

/** The words a point beyond its limits carries beside its marker, worst first. */
export function beyondWords(beyond: ChartLimit[]): string | null {
  if (beyond.length === 0) return null;
  const order: ChartLimit["kind"][] = ["reject", "spec", "action", "control"];
  return [...beyond]
    .sort((a, b) => order.indexOf(a.kind) - order.indexOf(b.kind))
    .map((l) => `beyond ${l.label}`)
    .join("; ");
}

/**
 * How far (in pixels, downwards) to move each line's label so that no two labels beside the plot
 * overlap: lines close in value (a control limit just inside an action limit) would otherwise print
 * one label over the other. Labels keep their top-to-bottom order; a label already clear of the
 * others stays on its line. `plotPx` is the height of the plotting area.
 */
export function labelNudges(
  values: readonly number[],
  domain: readonly [number, number],
  plotPx: number,
  minGapPx = 12,
): number[] {
  const [low, high] = domain;
  const span = high - low || 1;
  const y = values.map((v) => ((high - v) / span) * plotPx);
  const order = values.map((_, i) => i).sort((a, b) => y[a] - y[b] || a - b);
  const nudges = values.map(() => 0);
  let previous = -Infinity;
  for (const i of order) {
    const placed = Math.max(y[i], previous + minGapPx);
    nudges[i] = placed - y[i];
    previous = placed;
  }
  return nudges;
}

/**
 * A y-axis on round numbers: `domain` widened to the nearest round values and the ticks between
 * them (d3-array's `nice` and `ticks`: steps of 1, 2 or 5 times a power of ten). A domain ending on
 * 4,510 and 261,690 printed those odd values as ticks; it now runs 0 to 300,000 in 50,000s.
 */
export function roundAxis(
  domain: readonly [number, number],
  count = 5,
): { domain: [number, number]; ticks: number[] } {
  const [low, high] = nice(domain[0], domain[1], count);
  return { domain: [low, high], ticks: ticks(low, high, count) };
}

/**
 * Whether counts are better read on a logarithmic axis: the largest of the values and the limit
 * is at least `ratio` times the smallest count above zero, so on a straight axis from zero the
 * small counts would lie flat along its foot. Cleanliness levels are logarithmic themselves: each
 * level's upper bound is about double the one below (ISO 16232:2018, table of cleanliness levels).
 */
export function countsSpanDecades(values: readonly number[], limit: number | null, ratio = 100) {
  const positive = values.filter((v) => Number.isFinite(v) && v > 0);
  if (positive.length === 0) return false;
  const high = Math.max(...positive, limit ?? 0);
  return high / Math.min(...positive) >= ratio;
}

/**
 * A logarithmic count axis on powers of ten: from the power at or below the lowest count up to the
 * first at or above the highest (10, 100, 1,000 …). When a count is zero the axis starts at 0, drawn
 * with a symmetric log scale that is linear below 1, so a run that found no particle of the class
 * is at the foot of the axis, not off it.
 */
export function decadeAxis(
  low: number,
  high: number,
): { domain: [number, number]; ticks: number[] } {
  const topPower = Math.ceil(Math.log10(Math.max(high, 1)));
  const lowPower = low > 0 ? Math.min(Math.floor(Math.log10(low)), topPower) : 0;
  const ticks = low > 0 ? [] : [0];
  for (let k = lowPower; k <= topPower; k++) ticks.push(10 ** k);
  return { domain: [low > 0 ? 10 ** lowPower : 0, 10 ** topPower], ticks };
}
