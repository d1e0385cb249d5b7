"use client";

import { useState } from "react";
import {
  Bar,
  CartesianGrid,
  ComposedChart,
  ReferenceLine,
  ResponsiveContainer,
  Scatter,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import { chartDomain } from "@/lib/evidence/chart-limits";
import { evaluateExtraction } from "@/lib/cleanliness";
import {
  attempt,
  CalcError,
  CalcPanel,
  errorFor,
  generalError,
  parseInput,
  requiredInput,
  Verdict,
} from "./calc-kit";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { NumberField } from "@/components/ui/field";

const SLOTS = 8;
const STATUS_TEXT = {
  complete: "Extraction complete",
  "extract-again": "Not yet complete: extract again",
  "change-parameters":
    "Not reached within the allowed extractions: change the extraction parameters and qualify again",
} as const;

/** The declining test: a thin wrapper over evaluateExtraction, with a chart of the decay values. */
export function ExtractionCalculator() {
  const [counts, setCounts] = useState<string[]>(["100", "30", "8", "", "", "", "", ""]);
  const [maxRatio, setMaxRatio] = useState("0.10");
  const [maxExtractions, setMaxExtractions] = useState("6");

  // The series ends at the first blank slot.
  const firstBlank = counts.findIndex((c) => c.trim() === "");
  const series = (firstBlank < 0 ? counts : counts.slice(0, firstBlank)).map(requiredInput);
  const outcome = attempt(() =>
    evaluateExtraction(series, {
      maxRatio: parseInput(maxRatio),
      maxExtractions: parseInput(maxExtractions),
    }),
  );
  const limit = parseInput(maxRatio) ?? 0.1;
  let cumulative = 0;
  const rows = outcome.ok
    ? outcome.value.ratios.map((ratio, i) => {
        cumulative += series[i];
        const percent = ratio * 100;
        // Drawn again as a triangle on its bar: above the limit by shape and word, not colour alone.
        const above = ratio > limit ? percent : null;
        return { n: i + 1, count: series[i], cumulative, ratio, percent, above };
      })
    : [];
  const above = rows.filter((r) => r.above !== null).map((r) => r.n);
  // Decay values are shares (0–100 %); the axis still reaches a limit typed above them.
  const domain = chartDomain([0, 100, ...rows.map((r) => r.percent)], [{ value: limit * 100 }]);

  return (
    <CalcPanel
      title="Calculator: extraction curve (declining test)"
      form={
        <>
          <fieldset>
            <legend className="text-sm font-medium text-stone-800">
              Particles found per extraction, in order (blank ends the series)
            </legend>
            <div className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-4">
              {counts.map((value, i) => (
                <NumberField
                  key={i}
                  label={`C${i + 1} (particles)`}
                  value={value}
                  onValueChange={(v) =>
                    setCounts((prev) => prev.map((old, j) => (j === i ? v : old)))
                  }
                />
              ))}
            </div>
            <p className="mt-2 text-xs text-stone-600">
              Up to {SLOTS} extractions; only those up to the allowed number are evaluated.
            </p>
          </fieldset>
          <NumberField
            label="Decay-value limit (fraction; 0.10 = 10 %)"
            value={maxRatio}
            onValueChange={setMaxRatio}
            error={errorFor(outcome, "maxRatio")}
          />
          <NumberField
            label="Extractions allowed"
            unit="extractions"
            value={maxExtractions}
            onValueChange={setMaxExtractions}
            error={errorFor(outcome, "maxExtractions")}
          />
        </>
      }
      result={
        <>
          <CalcError message={generalError(outcome, ["maxRatio", "maxExtractions"])} />
          {outcome.ok && (
            <>
              <p className="text-sm">
                <Verdict
                  pass={outcome.value.complete}
                  passWord={`${STATUS_TEXT.complete} at n = ${outcome.value.step}`}
                  failWord={STATUS_TEXT[outcome.value.status]}
                />
              </p>
              <Table density="compact" caption="Decay value after each extraction">
                <THead>
                  <Th>n</Th>
                  <Th align="right">C_n (particles)</Th>
                  <Th align="right">C_1 + … + C_n (particles)</Th>
                  <Th align="right">Decay value (%)</Th>
                  <Th align="right">≤ limit?</Th>
                </THead>
                <TBody className="font-mono">
                  {rows.map((r) => (
                    <tr key={r.n}>
                      <Td>{r.n}</Td>
                      <Td align="right">{r.count}</Td>
                      <Td align="right">{r.cumulative}</Td>
                      <Td align="right">{r.percent.toFixed(1)} %</Td>
                      <Td align="right">{r.ratio <= limit ? "yes" : "no"}</Td>
                    </tr>
                  ))}
                </TBody>
              </Table>
              <figure>
                <div
                  className="h-56 w-full"
                  role="img"
                  aria-label={`Decay values in percent: ${rows.map((r) => `n ${r.n}: ${r.percent.toFixed(1)} %`).join(", ")}; limit ${(limit * 100).toFixed(1)} %.`}
                >
                  <ResponsiveContainer width="100%" height="100%">
                    <ComposedChart data={rows} margin={{ top: 8, right: 16, bottom: 16, left: 0 }}>
                      <CartesianGrid strokeDasharray="3 3" stroke="#e7e5e4" />
                      <XAxis
                        dataKey="n"
                        label={{ value: "Extraction n", position: "insideBottom", offset: -8 }}
                      />
                      <YAxis unit=" %" domain={domain} />
                      <Tooltip
                        formatter={(value) => [`${Number(value).toFixed(1)} %`, "Decay value"]}
                        labelFormatter={(n) => `Extraction ${n}`}
                      />
                      <Bar dataKey="percent" fill="#1f7f78" isAnimationActive={false} />
                      <Scatter
                        dataKey="above"
                        fill="#7f1d1d"
                        shape="triangle"
                        isAnimationActive={false}
                      />
                      <ReferenceLine
                        y={limit * 100}
                        stroke="#44403c"
                        strokeDasharray="6 3"
                        label={{
                          value: `limit ${(limit * 100).toFixed(1)} %`,
                          position: "insideTopRight",
                          fill: "#44403c",
                        }}
                      />
                    </ComposedChart>
                  </ResponsiveContainer>
                </div>
                <figcaption className="text-xs text-stone-600">
                  Bars: decay value C_n / (C_1 + … + C_n) in %; dashed line: the limit. Triangles:
                  above the limit ({above.length ? `n = ${above.join(", ")}` : "none"}).
                </figcaption>
              </figure>
            </>
          )}
        </>
      }
    />
  );
}
