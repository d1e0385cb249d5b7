import { individualsChart, type ControlRule } from "@/lib/stats";
import { BATH_VARIABLES, type BathVariable } from "./maintenance";
import { formatDate } from "@/lib/format/date";

const RULE_WORDS: Record<ControlRule, string> = {
  "beyond-limits": "beyond the 3σ limits",
  "run-of-8": "eighth in a run on one side of the centre line",
  "moving-range-above-limit": "jump from the previous value above the moving-range limit",
};

/** The points and limits of an individuals chart of one monitored bath value, from lib/stats. */
export function bathControlChart(
  records: { performedAt: string; values: Partial<Record<BathVariable, number | null>> }[],
  variable: BathVariable,
) {
  const points = records
    .filter((r) => typeof r.values[variable] === "number")
    .map((r) => ({ at: r.performedAt, value: r.values[variable] as number }));
  if (points.length < 2) return null;
  const chart = individualsChart(points.map((p) => p.value));
  // Individual values are flagged on the chart; moving-range signals are listed beside it.
  const flags = new Map<number, string>();
  const movingRangeSignals: string[] = [];
  for (const o of chart.outOfControl) {
    if (o.rule === "moving-range-above-limit")
      movingRangeSignals.push(
        `${formatDate(points[o.index - 1].at)} → ${formatDate(points[o.index].at)}`,
      );
    else flags.set(o.index, [flags.get(o.index), RULE_WORDS[o.rule]].filter(Boolean).join("; "));
  }
  return {
    title: BATH_VARIABLES[variable].label,
    unit: BATH_VARIABLES[variable].unit,
    centre: chart.individuals.centre,
    ucl: chart.individuals.ucl,
    lcl: chart.individuals.lcl,
    movingRangeLimit: chart.movingRange.ucl,
    movingRangeSignals,
    points: points.map((p, i) => ({ ...p, outOfControl: flags.get(i) ?? null })),
  };
}
