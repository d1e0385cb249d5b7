import { individualsChart, type ControlRule } from "@/lib/stats";
import type { BathLimits } from "@/lib/bath/limits";
import { formatNumber } from "@/lib/format/number";
import { BATH_VARIABLES, type BathVariable } from "./maintenance";
import { beyondWords, chartDomain, pointBeyond, type ChartLimit } from "./chart-limits";
import { formatDate } from "@/lib/format/date";

const RULE_WORDS: Record<ControlRule, string> = {
  "beyond-limits": "beyond the 3σ limits",
  "run-of-8": "eighth in a run on one side of the centre line",
  "moving-range-above-limit": "jump from the previous value above the moving-range limit",
};

/** The plan's target, action and reject limits of one value as labelled chart lines. */
export function planChartLimits(plan: BathLimits | null | undefined): ChartLimit[] {
  if (!plan) return [];
  const fmt = (n: number) => formatNumber(n, 2);
  const lines: (ChartLimit | null)[] = [
    plan.target !== null
      ? { kind: "target", label: `target ${fmt(plan.target)}`, value: plan.target }
      : null,
    plan.actionLow !== null
      ? {
          kind: "action",
          label: `action low ${fmt(plan.actionLow)}`,
          value: plan.actionLow,
          side: "low",
        }
      : null,
    plan.actionHigh !== null
      ? {
          kind: "action",
          label: `action high ${fmt(plan.actionHigh)}`,
          value: plan.actionHigh,
          side: "high",
        }
      : null,
    plan.rejectLow !== null
      ? {
          kind: "reject",
          label: `reject low ${fmt(plan.rejectLow)}`,
          value: plan.rejectLow,
          side: "low",
        }
      : null,
    plan.rejectHigh !== null
      ? {
          kind: "reject",
          label: `reject high ${fmt(plan.rejectHigh)}`,
          value: plan.rejectHigh,
          side: "high",
        }
      : null,
  ];
  return lines.filter((l) => l !== null);
}

/**
 * The points and limits of an individuals chart of one monitored bath value, from lib/stats, with
 * the tank plan's limits beside the statistical ones and a y-range that holds every line.
 */
export function bathControlChart(
  records: { performedAt: string; values: Partial<Record<BathVariable, number | null>> }[],
  variable: BathVariable,
  plan?: BathLimits | null,
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
  const limits = planChartLimits(plan);
  const { centre, ucl, lcl } = chart.individuals;
  const fmt = (n: number) => formatNumber(n, 2);
  const allLines: ChartLimit[] = [
    ...limits,
    { kind: "control", label: `UCL ${fmt(ucl)}`, value: ucl },
    { kind: "centre", label: `x̄ ${fmt(centre)}`, value: centre },
    { kind: "control", label: `LCL ${fmt(lcl)}`, value: lcl },
  ];
  return {
    title: BATH_VARIABLES[variable].label,
    unit: BATH_VARIABLES[variable].unit,
    centre,
    ucl,
    lcl,
    limits,
    domain: chartDomain(
      points.map((p) => p.value),
      allLines,
    ),
    movingRangeLimit: chart.movingRange.ucl,
    movingRangeSignals,
    points: points.map((p, i) => {
      // Only the plan's limits: the 3σ limits are judged by the control rules above.
      const beyond = pointBeyond(p.value, limits);
      return {
        ...p,
        outOfControl: flags.get(i) ?? null,
        beyondLimit: beyond.some((l) => l.kind === "reject")
          ? ("reject" as const)
          : beyond.some((l) => l.kind === "action")
            ? ("action" as const)
            : null,
        beyondWords: beyondWords(beyond),
      };
    }),
  };
}
