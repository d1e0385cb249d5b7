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
import { formatDate } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";

export interface ControlChartProps {
  title: string;
  unit: string;
  points: { at: string; value: number; outOfControl: string | null }[];
  centre: number;
  ucl: number;
  lcl: number;
  movingRangeLimit: number;
  /** Pairs of dates whose moving range is above its limit. */
  movingRangeSignals: string[];
}

const fmt = (n: number) => formatNumber(n, 2);

/** Individuals chart: each value with the centre line and 3σ limits; out-of-control points drawn as crosses and listed in words. */
export function ControlChart({
  title,
  unit,
  points,
  centre,
  ucl,
  lcl,
  movingRangeLimit,
  movingRangeSignals,
}: ControlChartProps) {
  const data = points.map((p) => ({
    ...p,
    date: formatDate(p.at),
    flagged: p.outOfControl ? p.value : null,
  }));
  const flagged = points.filter((p) => p.outOfControl);
  return (
    <figure
      className="rounded-lg border border-stone-200 bg-white p-4"
      aria-label={`Control chart: ${title}`}
    >
      <h3 className="text-sm font-semibold">
        {title} ({unit})
      </h3>
      <div className="mt-2 h-64">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ left: 12, right: 60, top: 8, bottom: 8 }}>
            <CartesianGrid stroke="#e7e5e4" />
            <XAxis dataKey="date" tick={{ fontSize: 11 }} />
            <YAxis
              tick={{ fontSize: 11 }}
              domain={["auto", "auto"]}
              label={{ value: unit, angle: -90, position: "insideLeft", fontSize: 11 }}
            />
            <Tooltip
              formatter={(v, name) => [
                `${fmt(Number(v))} ${unit}`,
                name === "flagged" ? "Out of control" : title,
              ]}
            />
            <ReferenceLine
              y={ucl}
              stroke="#44403c"
              strokeDasharray="6 3"
              label={{ value: `UCL ${fmt(ucl)}`, position: "right", fontSize: 11 }}
            />
            <ReferenceLine
              y={centre}
              stroke="#115e59"
              label={{ value: `x̄ ${fmt(centre)}`, position: "right", fontSize: 11 }}
            />
            <ReferenceLine
              y={lcl}
              stroke="#44403c"
              strokeDasharray="6 3"
              label={{ value: `LCL ${fmt(lcl)}`, position: "right", fontSize: 11 }}
            />
            <Line dataKey="value" stroke="#115e59" dot={{ r: 3 }} isAnimationActive={false} />
            <Scatter
              dataKey="flagged"
              name="flagged"
              fill="#7f1d1d"
              shape="cross"
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2 text-xs text-stone-700">
        Individuals chart, limits x̄ ± 3·MR̄/1.128 (ASTM E2587).{" "}
        {flagged.length === 0 ? (
          "No point out of control."
        ) : (
          <span>
            <strong>Out of control:</strong>{" "}
            {flagged
              .map((p) => `${formatDate(p.at)} (${fmt(p.value)} ${unit}, ${p.outOfControl})`)
              .join("; ")}
            .
          </span>
        )}{" "}
        Moving range limit {fmt(movingRangeLimit)} {unit}
        {movingRangeSignals.length
          ? `; exceeded between ${movingRangeSignals.join(", ")}.`
          : "; not exceeded."}
      </figcaption>
    </figure>
  );
}
