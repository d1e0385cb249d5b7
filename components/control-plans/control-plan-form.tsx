"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Field, FieldError, NumberField, SelectField, TextareaField } from "@/components/ui/field";
import {
  AddRowButton,
  MoveRowButtons,
  PayloadField,
  RemoveRowButton,
  useRowList,
} from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";
import { DEFAULT_MIN_CYCLES } from "@/lib/changes/requalification";
import {
  CHARACTERISTIC_LABELS,
  CHARACTERISTICS,
  FREQUENCIES,
  FREQUENCY_LABELS,
  isBathCharacteristic,
  takesMinCycles,
  type Characteristic,
} from "@/lib/control-plans/characteristics";

export interface LineDraft {
  characteristic: string;
  method: string;
  stageId: string;
  sampleSize: string;
  minCycles: string;
  frequency: string;
  everyN: string;
  reactionPlan: string;
}

export const EMPTY_LINE: LineDraft = {
  characteristic: "",
  method: "",
  stageId: "",
  sampleSize: "",
  minCycles: String(DEFAULT_MIN_CYCLES),
  frequency: "",
  everyN: "",
  reactionPlan: "",
};

const CHARACTERISTIC_OPTIONS = CHARACTERISTICS.map((c) => ({
  value: c,
  label: CHARACTERISTIC_LABELS[c],
}));
const FREQUENCY_OPTIONS = FREQUENCIES.map((f) => ({ value: f, label: FREQUENCY_LABELS[f] }));

/**
 * The lines of a control plan, for a new plan (with its combination) or a draft version. The
 * whole form is one payload, so nothing typed is lost on a refusal.
 */
export function ControlPlanForm({
  action,
  label,
  combinations,
  tanks,
  versionId,
  initialLines,
  submitLabel,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  label: string;
  /** For a new plan: the qualified combinations without one. */
  combinations?: { value: string; label: string; systemId: string }[];
  tanks: { id: string; systemId: string; name: string }[];
  /** For a draft: the version whose lines are replaced. */
  versionId?: string;
  initialLines?: LineDraft[];
  submitLabel: string;
}) {
  const [combination, setCombination] = useState("");
  const lines = useRowList<LineDraft>(() => initialLines ?? [EMPTY_LINE]);
  const systemId = combinations
    ? combinations.find((c) => c.value === combination)?.systemId
    : tanks[0]?.systemId;
  const tankOptions = tanks
    .filter((t) => t.systemId === systemId)
    .map((t) => ({ value: t.id, label: t.name }));
  const payload = combinations
    ? { combination, lines: lines.values }
    : { versionId, lines: lines.values };
  const setCharacteristic = (i: number, value: string) => {
    const c = value as Characteristic;
    const row = lines.values[i];
    lines.update(i, {
      characteristic: value,
      stageId: value && isBathCharacteristic(c) ? row.stageId : "",
      minCycles: value && takesMinCycles(c) ? row.minCycles || String(DEFAULT_MIN_CYCLES) : "",
    });
  };
  return (
    <ActionForm action={action} aria-label={label} className="space-y-5">
      <PayloadField value={payload} />
      {combinations && (
        <SelectField
          label="Qualified combination"
          errorKey="combination"
          placeholder="Choose…"
          value={combination}
          onValueChange={setCombination}
          options={combinations.map((c) => ({ value: c.value, label: c.label }))}
          hint="A recipe version qualified for a part family. Combinations that already have a plan are revised from their plan's page."
          className="max-w-2xl"
        />
      )}
      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-stone-800">Lines</legend>
        {lines.rows.map((row, i) => {
          const n = i + 1;
          const line = row.value;
          const c = line.characteristic as Characteristic;
          const bath = line.characteristic !== "" && isBathCharacteristic(c);
          return (
            <div
              key={row.key}
              role="group"
              aria-label={`Line ${n}`}
              className="grid gap-3 rounded-md border border-stone-200 bg-white p-3 sm:grid-cols-4"
            >
              <SelectField
                label={`Characteristic ${n}`}
                errorKey={`lines.${i}.characteristic`}
                placeholder="Choose…"
                value={line.characteristic}
                onValueChange={(v) => setCharacteristic(i, v)}
                options={CHARACTERISTIC_OPTIONS}
              />
              <Field
                label={`Method ${n}`}
                errorKey={`lines.${i}.method`}
                value={line.method}
                onValueChange={(method) => lines.update(i, { method })}
                hint="The test or instrument, e.g. pressure rinse, 5 µm membrane."
              />
              <SelectField
                label={`Tank ${n}`}
                errorKey={`lines.${i}.stageId`}
                placeholder={bath ? "Choose…" : "Not for tests on parts"}
                disabled={!bath}
                value={line.stageId}
                onValueChange={(stageId) => lines.update(i, { stageId })}
                options={tankOptions}
              />
              <NumberField
                label={`Sample size ${n}`}
                integer
                unit={bath ? "readings" : "parts"}
                errorKey={`lines.${i}.sampleSize`}
                value={line.sampleSize}
                onValueChange={(sampleSize) => lines.update(i, { sampleSize })}
              />
              <NumberField
                label={`Distinct cycles ${n}`}
                integer
                unit="cycles"
                disabled={line.characteristic !== "" && !takesMinCycles(c)}
                errorKey={`lines.${i}.minCycles`}
                value={line.minCycles}
                onValueChange={(minCycles) => lines.update(i, { minCycles })}
                hint="Samples from at least this many wash cycles."
              />
              <SelectField
                label={`Frequency ${n}`}
                errorKey={`lines.${i}.frequency`}
                placeholder="Choose…"
                value={line.frequency}
                onValueChange={(frequency) =>
                  lines.update(i, {
                    frequency,
                    everyN: frequency === "every_n_cycles" ? line.everyN : "",
                  })
                }
                options={FREQUENCY_OPTIONS}
              />
              <NumberField
                label={`Every N cycles ${n}`}
                integer
                unit="cycles"
                disabled={line.frequency !== "every_n_cycles"}
                errorKey={`lines.${i}.everyN`}
                value={line.everyN}
                onValueChange={(everyN) => lines.update(i, { everyN })}
              />
              <div className="flex items-end gap-2">
                <MoveRowButtons
                  label={`line ${n}`}
                  first={i === 0}
                  last={i === lines.rows.length - 1}
                  onMove={(d) => lines.move(i, d)}
                />
                <RemoveRowButton label={`Remove line ${n}`} onRemove={() => lines.remove(i)} />
              </div>
              <TextareaField
                label={`Reaction plan ${n}`}
                errorKey={`lines.${i}.reactionPlan`}
                rows={2}
                className="sm:col-span-4"
                value={line.reactionPlan}
                onValueChange={(reactionPlan) => lines.update(i, { reactionPlan })}
                hint="What to do when a result is out: hold, retest, containment, who decides."
              />
            </div>
          );
        })}
        <FieldError name="lines" />
        <AddRowButton onAdd={() => lines.add(EMPTY_LINE)}>Add a line</AddRowButton>
      </fieldset>
      <SubmitButton>{submitLabel}</SubmitButton>
    </ActionForm>
  );
}
