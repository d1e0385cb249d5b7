"use client";

import {
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import { chartDomain, labelNudges, roundAxis, type ChartLimit } from "@/lib/evidence/chart-limits";
import { formatDate } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";

export interface ControlChartProps {
  title: string;
  unit: string;
  points: {
    at: string;
    value: number;
    outOfControl: string | null;
    beyondLimit?: "action" | "reject" | null;
    beyondWords?: string | null;
  }[];
  centre: number;
  ucl: number;
  lcl: number;
  /** The plan's target, action and reject limits (or a specification's), drawn beside the 3σ ones. */
  limits?: ChartLimit[];
  /** A y-range that holds every point and every line; computed here with chartDomain when not given. */
  domain?: [number, number];
  movingRangeLimit: number;
  /** Pairs of dates whose moving range is above its limit. */
  movingRangeSignals: string[];
}

const fmt = (n: number) => formatNumber(n, 2);

const LINE_STYLE: Record<ChartLimit["kind"], { stroke: string; dash?: string }> = {
  reject: { stroke: "#7f1d1d", dash: "2 2" },
  spec: { stroke: "#7f1d1d", dash: "6 3" },
  action: { stroke: "#9a3412", dash: "4 4" },
  control: { stroke: "#44403c", dash: "6 3" },
  centre: { stroke: "#115e59" },
  target: { stroke: "#1e3a8a", dash: "1 3" },
};

/**
 * Individuals chart: each value with the centre line, 3σ limits and the plan's limits, every line
 * labelled. Points beyond a reject limit are triangles, beyond an action limit diamonds, out of
 * statistical control crosses; each is also listed in words under the chart.
 */
/** The plotting area's height inside the h-72 (288 px) box, less the margins and the date axis. */
const PLOT_HEIGHT_PX = 288 - 8 - 8 - 30;

export function ControlChart({
  title,
  unit,
  points,
  centre,
  ucl,
  lcl,
  limits = [],
  domain,
  movingRangeLimit,
  movingRangeSignals,
}: ControlChartProps) {
  const data = points.map((p) => ({
    ...p,
    date: formatDate(p.at),
    flagged: p.outOfControl ? p.value : null,
    reject: p.beyondLimit === "reject" ? p.value : null,
    action: p.beyondLimit === "action" ? p.value : null,
  }));
  const flagged = points.filter((p) => p.outOfControl);
  const beyond = points.filter((p) => p.beyondWords);
  const lines: ChartLimit[] = [
    { kind: "control", label: `UCL ${fmt(ucl)}`, value: ucl },
    { kind: "centre", label: `x̄ ${fmt(centre)}`, value: centre },
    { kind: "control", label: `LCL ${fmt(lcl)}`, value: lcl },
    ...limits,
  ];
  const axis = roundAxis(
    domain ??
      chartDomain(
        points.map((p) => p.value),
        lines,
      ),
  );
  // Labels of lines close in value (UCL just inside an action limit) are moved apart.
  const nudges = labelNudges(
    lines.map((l) => l.value),
    axis.domain,
    PLOT_HEIGHT_PX,
  );
  return (
    <figure
      className="rounded-lg border border-stone-200 bg-white p-4"
      aria-label={`Control chart: ${title}`}
    >
      <h3 className="text-sm font-semibold">
        {title}
        {unit !== title && ` (${unit})`}
      </h3>
      <div className="mt-2 h-72">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ left: 12, right: 110, top: 8, bottom: 8 }}>
            <CartesianGrid stroke="#e7e5e4" />
            <XAxis dataKey="date" tick={{ fontSize: 11 }} />
            <YAxis
              tick={{ fontSize: 11 }}
              domain={axis.domain}
              ticks={axis.ticks}
              allowDataOverflow={false}
              tickFormatter={(v: number) => fmt(v)}
              label={{ value: unit, angle: -90, position: "insideLeft", fontSize: 11 }}
            />
            <Tooltip
              formatter={(v, name) => [
                `${fmt(Number(v))} ${unit}`,
                name === "flagged"
                  ? "Out of control"
                  : name === "reject"
                    ? "Beyond reject limit"
                    : name === "action"
                      ? "Beyond action limit"
                      : title,
              ]}
            />
            {lines.map((l, i) => (
              <ReferenceLine
                key={`${l.kind}-${l.label}-${i}`}
                y={l.value}
                stroke={LINE_STYLE[l.kind].stroke}
                strokeDasharray={LINE_STYLE[l.kind].dash}
                ifOverflow="extendDomain"
                label={{ value: l.label, position: "right", fontSize: 11, dy: nudges[i] }}
              />
            ))}
            <Line dataKey="value" stroke="#115e59" dot={{ r: 3 }} isAnimationActive={false} />
            <Scatter
              dataKey="flagged"
              name="flagged"
              fill="#7f1d1d"
              shape="cross"
              isAnimationActive={false}
            />
            <Scatter
              dataKey="action"
              name="action"
              fill="#9a3412"
              shape="diamond"
              isAnimationActive={false}
            />
            <Scatter
              dataKey="reject"
              name="reject"
              fill="#7f1d1d"
              shape="triangle"
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2 space-y-1 text-xs text-stone-700">
        <span className="block">
          Individuals chart, limits x̄ ± 3·MR̄/1.128 (ASTM E2587).{" "}
          {limits.length > 0
            ? `Plan limits drawn: ${limits.map((l) => l.label).join(", ")} ${unit}.`
            : "No plan limits set for this value."}{" "}
          Crosses: out of statistical control; diamonds: beyond an action limit; triangles: beyond a
          reject limit.
        </span>
        <span className="block">
          {beyond.length === 0 ? (
            "No point beyond a plan limit."
          ) : (
            <>
              <strong>Beyond plan limits:</strong>{" "}
              {beyond
                .map((p) => `${formatDate(p.at)} (${fmt(p.value)} ${unit}, ${p.beyondWords})`)
                .join("; ")}
              .
            </>
          )}
        </span>
        <span className="block">
          {flagged.length === 0 ? (
            "No point out of control."
          ) : (
            <>
              <strong>Out of control:</strong>{" "}
              {flagged
                .map((p) => `${formatDate(p.at)} (${fmt(p.value)} ${unit}, ${p.outOfControl})`)
                .join("; ")}
              .
            </>
          )}{" "}
          Moving range limit {fmt(movingRangeLimit)} {unit}
          {movingRangeSignals.length
            ? `; exceeded between ${movingRangeSignals.join(", ")}.`
            : "; not exceeded."}
        </span>
      </figcaption>
    </figure>
  );
}
