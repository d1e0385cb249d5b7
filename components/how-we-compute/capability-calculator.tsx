"use client";

import { useState } from "react";
import { capability, individualsChart, type CapabilityResult } from "@/lib/stats";
import {
  attempt,
  CalcError,
  CalcPanel,
  errorFor,
  fixed,
  generalError,
  parseInput,
  requiredInput,
} from "./calc-kit";
import { TBody, Table, Td, Th } from "@/components/ui/table";
import { ChoiceGroup, Field, NumberField } from "@/components/ui/field";

type Mode = "summary" | "values";

// Invented measurements near the textbook example (mean about 107, specification 100 ± 10).
const EXAMPLE_VALUES =
  "106.2, 108.1, 107.4, 105.9, 107.8, 106.5, 108.3, 107.0, 106.1, 107.6, 108.0, 106.8";

/** Capability: a thin wrapper over capability (and individualsChart for the stability check). */
export function CapabilityCalculator() {
  const [mode, setMode] = useState<Mode>("summary");
  const [unit, setUnit] = useState("mg");
  const [lsl, setLsl] = useState("90");
  const [usl, setUsl] = useState("110");
  const [mean, setMean] = useState("107");
  const [sigma, setSigma] = useState("1.5");
  const [values, setValues] = useState(EXAMPLE_VALUES);

  const limits = { lsl: parseInput(lsl), usl: parseInput(usl) };
  const series = values
    .split(/[\s,;]+/)
    .filter((v) => v !== "")
    .map((v) => Number(v));
  const outcome = attempt(() =>
    mode === "summary"
      ? capability({ mean: requiredInput(mean), sigma: requiredInput(sigma), ...limits })
      : capability({ values: series, ...limits }),
  );
  const chart = mode === "values" && outcome.ok ? attempt(() => individualsChart(series)) : null;
  const u = unit.trim() === "" ? "" : ` ${unit.trim()}`;
  const fields = ["lsl", "usl", "mean", "sigma", "values"];

  return (
    <CalcPanel
      title="Calculator: process capability"
      form={
        <>
          <ChoiceGroup
            type="radio"
            name="cap-mode"
            legend="Input"
            inline
            value={mode}
            onValueChange={(v) => setMode(v as typeof mode)}
            options={[
              { value: "summary", label: "Mean and σ" },
              { value: "values", label: "Individual measurements" },
            ]}
          />
          <Field
            label="Unit of the measurements"
            value={unit}
            onValueChange={setUnit}
            hint="Shown with every value below, e.g. mg, µS/cm, °C."
          />
          <div className="grid grid-cols-2 gap-3">
            <NumberField
              label="Lower specification limit (LSL, optional)"
              unit={unit}
              value={lsl}
              onValueChange={setLsl}
              error={errorFor(outcome, "lsl")}
            />
            <NumberField
              label="Upper specification limit (USL, optional)"
              unit={unit}
              value={usl}
              onValueChange={setUsl}
              error={errorFor(outcome, "usl")}
            />
          </div>
          {mode === "summary" ? (
            <div className="grid grid-cols-2 gap-3">
              <NumberField
                label="Mean x̄"
                unit={unit}
                value={mean}
                onValueChange={setMean}
                error={errorFor(outcome, "mean")}
              />
              <NumberField
                label="Standard deviation σ"
                unit={unit}
                value={sigma}
                onValueChange={setSigma}
                error={errorFor(outcome, "sigma")}
              />
            </div>
          ) : (
            <Field
              label="Measurements in time order"
              unit={unit}
              value={values}
              onValueChange={setValues}
              hint="Separated by commas, semicolons, spaces or new lines; use a decimal point."
              error={errorFor(outcome, "values")}
            />
          )}
        </>
      }
      result={
        <>
          <CalcError message={generalError(outcome, fields)} />
          {outcome.ok && <CapabilityTable result={outcome.value} unit={u} />}
          {chart && !chart.ok && <CalcError message={chart.message} />}
          {chart?.ok && (
            <div className="space-y-1 text-sm text-stone-700">
              <p>
                Stability (individuals chart): centre {fixed(chart.value.individuals.centre, 3)}
                {u}, limits {fixed(chart.value.individuals.lcl, 3)}
                {u} to {fixed(chart.value.individuals.ucl, 3)}
                {u}; moving-range limit {fixed(chart.value.movingRange.ucl, 3)}
                {u}.
              </p>
              <p>
                {chart.value.outOfControl.length === 0
                  ? "No point out of control: capability can be read as the process's."
                  : `Out of control: ${chart.value.outOfControl.map((p) => `value ${p.index + 1} (${p.rule.replace(/-/g, " ")})`).join(", ")}. Capability describes a stable process only; find the cause first.`}
              </p>
            </div>
          )}
        </>
      }
    />
  );
}

function CapabilityTable({ result, unit }: { result: CapabilityResult; unit: string }) {
  const rows: Array<[string, number | undefined, string]> = [
    ["Mean x̄", result.mean, unit],
    [result.sigmaOverall === undefined ? "σ" : "σ within (MR̄ / 1.128)", result.sigma, unit],
    ["σ overall (sample, n − 1)", result.sigmaOverall, unit],
    ["Cp = (USL − LSL) / 6σ", result.cp, " (ratio)"],
    ["CPU = (USL − x̄) / 3σ", result.cpu, " (ratio)"],
    ["CPL = (x̄ − LSL) / 3σ", result.cpl, " (ratio)"],
    ["Cpk = min(CPU, CPL)", result.cpk, " (ratio)"],
    ["Pp (overall σ)", result.pp, " (ratio)"],
    ["Ppk (overall σ)", result.ppk, " (ratio)"],
  ];
  return (
    <Table density="compact" caption="Capability indices">
      <TBody>
        {rows
          .filter(([, value]) => value !== undefined)
          .map(([label, value, u]) => (
            <tr key={label}>
              <Th scope="row">{label}</Th>
              <Td align="right" className="font-mono">
                {fixed(value!, label.startsWith("Mean") || label.startsWith("σ") ? 4 : 2)}
                {u}
              </Td>
            </tr>
          ))}
      </TBody>
    </Table>
  );
}
