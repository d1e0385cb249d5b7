"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { CheckboxField, ChoiceGroup, Field, NumberField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { TestType } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { SIZE_CLASSES } from "@/lib/cleanliness";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

const um = (min: number, max: number | null) => (max === null ? `≥ ${min} µm` : `${min}–${max} µm`);

/** Thirteen count inputs, one per ISO 16232 size class, named `${prefix}.B` … `${prefix}.N`; each box holds six digits. */
export function CountsGrid({
  prefix,
  legend,
  defaults,
}: {
  prefix: string;
  legend: string;
  defaults?: Partial<Record<string, number>>;
}) {
  return (
    <fieldset className="space-y-1">
      <legend className="text-sm font-medium text-stone-800">{legend}</legend>
      <p className="text-xs text-stone-600">
        Absolute counts as found on the membrane (particles); leave a class empty when none was
        found.
      </p>
      <div className="grid grid-cols-[repeat(auto-fill,minmax(6rem,1fr))] gap-2">
        {SIZE_CLASSES.map((c) => (
          <div key={c.key} className="text-xs text-stone-700">
            <span aria-hidden="true" className="block font-medium">
              {c.key}
            </span>
            <span aria-hidden="true" className="block text-[10px] text-stone-500">
              {um(c.minUm, c.maxUm)}
            </span>
            <NumberField
              name={`${prefix}.${c.key}`}
              label={`${legend}: class ${c.key} (${um(c.minUm, c.maxUm)}), particles`}
              hideLabel
              integer
              dense
              defaultValue={defaults?.[c.key] ?? ""}
            />
          </div>
        ))}
      </div>
    </fieldset>
  );
}

function SampleIdentity() {
  return (
    <div className="grid gap-3 sm:grid-cols-4">
      <Field name="sampleLabel" label="Sample (part serial)" />
      <Field
        name="cycleNumber"
        label="Wash cycle (optional)"
        placeholder="the washer's cycle id"
        hint="Parts from different cycles are independent samples."
      />
      <Field
        name="basketPosition"
        label="Basket position (optional)"
        placeholder="e.g. top left corner"
      />
      <CheckboxField name="worstCase" label="Worst-case position" className="self-end pb-2" />
    </div>
  );
}

function ParticleFields() {
  const [split, setSplit] = useState(false);
  return (
    <>
      <NumberField
        name="components"
        label="Components in the sample"
        integer
        defaultValue="1"
        className="max-w-xs"
        hint="The area (or volume) of this many parts is the basis of the normalised counts."
      />
      <CountsGrid prefix="counts" legend="All particles" />
      <CheckboxField
        name="splitMeasured"
        label="Split by particle type measured"
        checked={split}
        onCheckedChange={setSplit}
      />
      {split && (
        <div className="space-y-3 border-l-2 border-stone-200 pl-3">
          <CountsGrid prefix="metallic" legend="Metallic" />
          <CountsGrid prefix="nonMetallic" legend="Non-metallic" />
          <CountsGrid prefix="fibre" legend="Fibres" />
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-3">
        <NumberField name="largest.metallicUm" label="Largest metallic particle (µm)" />
        <NumberField name="largest.nonMetallicUm" label="Largest non-metallic particle (µm)" />
        <NumberField name="largest.fibreUm" label="Largest fibre (µm)" />
      </div>
    </>
  );
}

function GravimetricFields() {
  return (
    <div className="grid gap-3 sm:grid-cols-4">
      <NumberField name="components" label="Components filtered" integer defaultValue="1" />
      <NumberField name="filterBeforeMg" label="Filter mass before (mg)" />
      <NumberField name="filterAfterMg" label="Filter mass after (mg)" />
      <NumberField name="blankMg" label="Blank residue (mg, optional)" />
    </div>
  );
}

function ObservationFields({ question }: { question: string }) {
  return (
    <>
      <ChoiceGroup
        type="radio"
        name="acceptable"
        legend={question}
        inline
        options={[
          { value: "yes", label: "Yes" },
          { value: "no", label: "No" },
        ]}
      />
      <Field name="observation" label="What was seen (optional)" />
      <p className="text-xs text-stone-600">
        Attach photos below; the run stays incomplete until at least one photo is attached.
      </p>
    </>
  );
}

const QUESTIONS = {
  visual: "Free of stains and visible residue?",
  uv_inspection: "Free of oil film under UV light?",
  dryness: "Dry?",
} as const;

/** The entry form for one sample, with the fields of the run's test type; units are in every label. */
export function SampleForm({
  action,
  runId,
  testType,
}: {
  action: Action;
  runId: string;
  testType: TestType;
}) {
  return (
    <ActionForm
      action={action}
      resetOnSuccess
      className="space-y-4 rounded-lg border border-stone-200 bg-white p-4"
      aria-label="Add a sample"
    >
      <input type="hidden" name="runId" value={runId} />
      <SampleIdentity />
      {testType === "particle_cleanliness" && <ParticleFields />}
      {testType === "gravimetric" && <GravimetricFields />}
      {testType === "wetting_tension" && (
        <Field
          name="readingsMNm"
          label="Test-ink readings (mN/m)"
          placeholder="e.g. 38, 40, 38"
          hint="Each reading is the ink that wets for about 2 s; separate with commas, decimals with a point."
        />
      )}
      {testType === "rinse_conductivity" && (
        <div className="grid gap-3 sm:grid-cols-2">
          <NumberField name="measuredUsPerCm" label="Measured conductivity (µS/cm)" />
          <NumberField
            name="temperatureC"
            label="Water temperature (°C)"
            hint="Compensated to 25 °C when the outcome is computed (linear 2 %/°C, instrument practice; below about 1 µS/cm use a meter set for pure water)."
          />
        </div>
      )}
      {(testType === "visual" || testType === "uv_inspection" || testType === "dryness") && (
        <ObservationFields question={QUESTIONS[testType]} />
      )}
      <SubmitButton>Add sample</SubmitButton>
    </ActionForm>
  );
}

/** Extraction series (declining test) and blank of a particle run. */
export function RunDataForm({
  action,
  runId,
  defaults,
}: {
  action: Action;
  runId: string;
  defaults: {
    extractionSeries: number[];
    blank: { counts: Record<string, number>; largestUm: number | null } | null;
  };
}) {
  const [blank, setBlank] = useState(defaults.blank !== null);
  return (
    <ActionForm
      action={action}
      className="space-y-4 rounded-lg border border-stone-200 bg-white p-4"
      aria-label="Extraction and blank"
    >
      <input type="hidden" name="runId" value={runId} />
      <Field
        name="extractionSeries"
        label="Extraction series (particles per extraction)"
        defaultValue={defaults.extractionSeries.join(", ")}
        placeholder="e.g. 1250, 310, 84"
        hint="Counts of successive extractions of the same parts (declining test, up to 6); separate with commas."
      />
      <CheckboxField
        name="blankMeasured"
        label="Blank value measured"
        checked={blank}
        onCheckedChange={setBlank}
      />
      {blank && (
        <>
          <CountsGrid prefix="blankCounts" legend="Blank" defaults={defaults.blank?.counts} />
          <NumberField
            name="blankLargestUm"
            label="Largest blank particle (µm)"
            defaultValue={defaults.blank?.largestUm ?? ""}
            className="max-w-xs"
          />
        </>
      )}
      <SubmitButton>Save extraction and blank</SubmitButton>
    </ActionForm>
  );
}
