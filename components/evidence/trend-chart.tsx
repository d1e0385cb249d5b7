"use client";

import { useState } from "react";
import {
  CartesianGrid,
  ComposedChart,
  Legend,
  Line,
  ReferenceLine,
  Scatter,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import { SelectField } from "@/components/ui/field";
import { chartDomain, countsSpanDecades, decadeAxis, roundAxis } from "@/lib/evidence/chart-limits";
import type { TrendSeries } from "@/lib/evidence/trends";
import { formatNumber } from "@/lib/format/number";

const fmt = (n: number) => formatNumber(n, 1);

/** Normalised count of one size-class limit over time, worst sample per run, with the specification limit. */
export function TrendChart({ series }: { series: TrendSeries }) {
  const [group, setGroup] = useState(series.groups[0]?.key ?? "");
  // Null until the user chooses: then the axis follows the data (logarithmic when it spans decades).
  const [logChoice, setLogChoice] = useState<boolean | null>(null);
  const current = series.groups.find((g) => g.key === group);
  const data = series.points.map((p) => ({
    run: p.run,
    date: p.date,
    outcome: p.outcome,
    // A run that counted no size class of this group has no point, never a zero that looks clean.
    value: p.values[group] ?? null,
    // Drawn again as a triangle: above the limit by shape and word, not by colour alone.
    over: current && (p.values[group] ?? 0) > current.limit ? (p.values[group] ?? 0) : null,
  }));
  // The axis always reaches the specification limit, however far below it the results lie; when
  // that leaves the results flat along its foot, a logarithmic axis spreads them out again.
  const values = data.flatMap((d) => (d.value === null ? [] : [d.value]));
  const logarithmic = logChoice ?? countsSpanDecades(values, current?.limit ?? null);
  const axis = logarithmic
    ? decadeAxis(values.length ? Math.min(...values) : 0, Math.max(...values, current?.limit ?? 0))
    : roundAxis(chartDomain(values, current ? [{ value: current.limit }] : []));
  return (
    <figure
      className="rounded-lg border border-stone-200 bg-white p-4"
      aria-label="Particle trend chart"
    >
      <SelectField
        label="Size classes"
        dense
        className="max-w-40"
        value={group}
        onValueChange={setGroup}
        options={series.groups.map((g) => ({ value: g.key, label: g.key }))}
      />
      <label className="mt-2 flex items-center gap-2 text-sm text-stone-700">
        <input
          type="checkbox"
          checked={logarithmic}
          onChange={(e) => setLogChoice(e.target.checked)}
        />
        Logarithmic axis, in steps of ten: counts far below the limit stay readable
      </label>
      <div className="mt-3 h-72">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ left: 12, right: 24, top: 8, bottom: 8 }}>
            <CartesianGrid stroke="#e7e5e4" />
            <XAxis dataKey="date" tick={{ fontSize: 11 }} />
            <YAxis
              tick={{ fontSize: 11 }}
              scale={logarithmic ? "symlog" : "linear"}
              domain={axis.domain}
              ticks={axis.ticks}
              tickFormatter={(v: number) => fmt(v)}
              // No rotated axis title: it printed over wide tick labels. The legend names the unit.
            />
            <Tooltip
              formatter={(v) => [`${fmt(Number(v))} ${series.unit}`, `Class ${group}`]}
              labelFormatter={(_l, p) =>
                p?.[0]
                  ? `${p[0].payload.run} · ${p[0].payload.date} · ${p[0].payload.outcome ?? ""}`
                  : ""
              }
            />
            <Legend />
            {current && (
              <ReferenceLine
                y={current.limit}
                ifOverflow="extendDomain"
                stroke="#7f1d1d"
                strokeDasharray="6 3"
                label={{
                  value: `limit ${current.limitLevel !== null ? `level ${current.limitLevel} = ` : ""}${fmt(current.limit)}`,
                  position: "insideTopRight",
                  fontSize: 11,
                }}
              />
            )}
            <Line
              type="monotone"
              dataKey="value"
              connectNulls
              name={`Class ${group} ${series.unit} (worst sample)`}
              stroke="#115e59"
              strokeWidth={2}
              dot={{ r: 3 }}
              isAnimationActive={false}
            />
            <Scatter
              dataKey="over"
              name="Above the specification limit (triangle)"
              fill="#7f1d1d"
              shape="triangle"
              isAnimationActive={false}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2 text-xs text-stone-600">
        {data.length} run(s){logarithmic ? ", on a logarithmic axis" : ""}. Dashed line: the
        specification limit, always drawn for class {group}
        {current ? ` (${fmt(current.limit)} ${series.unit})` : ""}. Runs above it (triangles):{" "}
        {data
          .filter((d) => current && d.value !== null && d.value > current.limit)
          .map((d) => d.run)
          .join(", ") || "none"}
        .
      </figcaption>
    </figure>
  );
}
