"use client";

import {
  ComposedChart,
  Line,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import type { TrendChartData } from "@/lib/overview/key-result";
import { formatDate } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";
import { roundAxis } from "@/lib/evidence/chart-limits";

const fmt = (n: number) => formatNumber(n, 2);

/**
 * A small trend of one washer × part family's key value: the specification limit always drawn and
 * labelled (the y-range holds it), points beyond it as triangles and named under the chart.
 */
export function ResultTrend({ data, title }: { data: TrendChartData; title: string }) {
  const rows = data.points.map((p) => ({
    ...p,
    date: formatDate(p.at),
    beyondValue: p.beyond ? p.value : null,
  }));
  const beyond = data.points.filter((p) => p.beyond);
  const axis = roundAxis(data.domain, 4);
  return (
    <figure aria-label={`Trend: ${title}`} className="min-w-0">
      <div className="h-28 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={rows} margin={{ left: 0, right: 64, top: 6, bottom: 0 }}>
            <XAxis dataKey="date" hide />
            <YAxis
              width={44}
              tick={{ fontSize: 10 }}
              domain={axis.domain}
              ticks={axis.ticks}
              allowDataOverflow={false}
              tickFormatter={(v: number) => formatNumber(v, 1)}
            />
            <Tooltip
              formatter={(v) => [`${fmt(Number(v))} ${data.unit}`, data.label]}
              labelFormatter={(_l, p) =>
                p?.[0]
                  ? `${p[0].payload.run} · ${p[0].payload.date} · ${p[0].payload.outcome ?? "no outcome"}`
                  : ""
              }
            />
            {data.limits.map((l) => (
              <ReferenceLine
                key={l.label}
                y={l.value}
                stroke="#7f1d1d"
                strokeDasharray="6 3"
                ifOverflow="extendDomain"
                label={{ value: l.label, position: "right", fontSize: 10, fill: "#44403c" }}
              />
            ))}
            <Line
              dataKey="value"
              stroke="#115e59"
              strokeWidth={2}
              dot={{ r: 2.5 }}
              isAnimationActive={false}
            />
            <Scatter
              dataKey="beyondValue"
              name="Beyond the limit (triangle)"
              fill="#7f1d1d"
              shape="triangle"
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="text-xs text-stone-600">
        Last {data.points.length} verified run{data.points.length === 1 ? "" : "s"}, oldest on the
        left; dashed line:{" "}
        {data.limits.length ? data.limits.map((l) => l.label).join(", ") : "no limit set"}.{" "}
        {beyond.length === 0 ? (
          "No run beyond the limit."
        ) : (
          <strong className="font-medium text-stone-800">
            Beyond (triangles):{" "}
            {beyond.map((p) => `${p.run} ${fmt(p.value)} ${data.unit}, ${p.beyond}`).join("; ")}.
          </strong>
        )}
      </figcaption>
    </figure>
  );
}
