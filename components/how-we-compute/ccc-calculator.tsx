"use client";

import { useState } from "react";
import {
  BASIS_UNIT,
  cleanlinessCode,
  cleanlinessLevel,
  evaluateAgainstSpec,
  normalizeCount,
  SIZE_CLASSES,
  type Basis,
  type ParticleCounts,
  type SizeClassKey,
} from "@/lib/cleanliness";
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
import { ChoiceGroup, Field, NumberField } from "@/components/ui/field";

type Kind = Basis["kind"];

const AMOUNT: Record<Kind, { label: string; unit: string; field: string }> = {
  area: { label: "Total tested area", unit: "cm²", field: "totalAreaCm2" },
  volume: { label: "Total tested volume", unit: "cm³", field: "totalVolumeCm3" },
  component: { label: "Components tested", unit: "parts", field: "components" },
};

// The worked example of the sample report: three parts, 112.05 cm² in all; E 14, F 6, H 1.
const EXAMPLE: Partial<Record<SizeClassKey, string>> = { E: "14", F: "6", H: "1" };

function basisOf(kind: Kind, amount: number): Basis {
  if (kind === "area") return { kind, totalAreaCm2: amount };
  if (kind === "volume") return { kind, totalVolumeCm3: amount };
  return { kind, components: amount };
}

/** CCC and specification check: a thin wrapper over cleanlinessCode and evaluateAgainstSpec. */
export function CccCalculator() {
  const [kind, setKind] = useState<Kind>("area");
  const [amount, setAmount] = useState("112.05");
  const [countText, setCountText] = useState<Partial<Record<SizeClassKey, string>>>(EXAMPLE);
  const [spec, setSpec] = useState("A(B-D17/E8/F-G7/H-I4/J-N00)");

  const counts: ParticleCounts = {};
  for (const { key } of SIZE_CLASSES) {
    const value = parseInput(countText[key] ?? "");
    if (value !== undefined) counts[key] = value;
  }
  const basis = basisOf(kind, requiredInput(amount));
  const code = attempt(() => cleanlinessCode(counts, basis));
  const evaluation =
    spec.trim() === "" ? null : attempt(() => evaluateAgainstSpec(counts, basis, spec));
  const fieldNames = [AMOUNT[kind].field, "basis", ...SIZE_CLASSES.map((c) => c.key)];
  const unit = BASIS_UNIT[kind];

  return (
    <CalcPanel
      title="Calculator: cleanliness code and specification"
      form={
        <>
          <ChoiceGroup
            type="radio"
            name="ccc-basis"
            legend="Counts related to"
            inline
            value={kind}
            onValueChange={(v) => setKind(v as typeof kind)}
            options={[
              { value: "area", label: "Area (A, per 1000 cm²)" },
              { value: "volume", label: "Volume (V, per 100 cm³)" },
              { value: "component", label: "Component (N)" },
            ]}
          />
          <NumberField
            label={AMOUNT[kind].label}
            unit={AMOUNT[kind].unit}
            value={amount}
            onValueChange={setAmount}
            error={errorFor(code, AMOUNT[kind].field, "basis")}
          />
          <fieldset>
            <legend className="text-sm font-medium text-stone-800">
              Absolute counts per size class, in particles (leave blank if not analysed)
            </legend>
            <div className="mt-2 grid grid-cols-2 gap-3 sm:grid-cols-3">
              {SIZE_CLASSES.map((c) => (
                <NumberField
                  key={c.key}
                  label={`${c.key}: ${c.minUm}${c.maxUm === null ? " µm and up" : `–${c.maxUm} µm`}`}
                  value={countText[c.key] ?? ""}
                  onValueChange={(v) => setCountText((prev) => ({ ...prev, [c.key]: v }))}
                  error={errorFor(code, c.key)}
                />
              ))}
            </div>
          </fieldset>
          <Field
            label="Specification in CCC notation (optional)"
            value={spec}
            onValueChange={setSpec}
            hint="e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00); hyphen-joined classes share one limit, letters written together (EF12) are limited each on its own."
            error={evaluation ? errorFor(evaluation, "spec", "basis") : undefined}
          />
        </>
      }
      result={
        <>
          <CalcError message={generalError(code, fieldNames)} />
          {code.ok && (
            <>
              <p className="text-sm text-stone-700">Component Cleanliness Code</p>
              <p className="break-all rounded-md bg-brand-50 px-3 py-2 font-mono text-lg text-brand-900">
                {code.value}
              </p>
              <Table density="compact" caption="Normalised counts and levels per size class">
                <THead>
                  <Th>Class</Th>
                  <Th align="right">Absolute (particles)</Th>
                  <Th align="right">Normalised ({unit})</Th>
                  {kind !== "component" && <Th align="right">Level</Th>}
                </THead>
                <TBody className="font-mono">
                  {SIZE_CLASSES.filter((c) => counts[c.key] !== undefined).map((c) => {
                    const normalised = normalizeCount(counts[c.key]!, basis);
                    return (
                      <tr key={c.key}>
                        <Td>{c.key}</Td>
                        <Td align="right">{counts[c.key]}</Td>
                        <Td align="right">{normalised.toFixed(2)}</Td>
                        {kind !== "component" && (
                          <Td align="right">{cleanlinessLevel(normalised)}</Td>
                        )}
                      </tr>
                    );
                  })}
                </TBody>
              </Table>
              <p className="text-xs text-stone-600">
                Classes not entered are not analysed; classes above the smallest one entered and
                left blank count as 0 (level 00).
              </p>
            </>
          )}
          {evaluation && !evaluation.ok && (
            <CalcError message={generalError(evaluation, ["spec", "basis", ...fieldNames])} />
          )}
          {evaluation?.ok && code.ok && (
            <div className="space-y-2">
              <p className="text-sm">
                Against {spec.trim()}:{" "}
                <Verdict
                  pass={evaluation.value.pass}
                  passWord="Meets the specification"
                  failWord="Does not meet the specification"
                />
              </p>
              <ul className="space-y-1 text-sm">
                {evaluation.value.rows.map((row) => (
                  <li key={row.classes.join("")} className="flex gap-2">
                    <Verdict pass={row.pass} />
                    <span className="font-mono text-stone-800">{row.reason}</span>
                  </li>
                ))}
              </ul>
            </div>
          )}
        </>
      }
    />
  );
}
