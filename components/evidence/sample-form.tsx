"use client";

import { useState } from "react";
import { ActionForm, useFormResult } from "@/components/ui/action-form";
import { Field, FieldError } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { TestType } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { SIZE_CLASSES } from "@/lib/cleanliness";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

const um = (min: number, max: number | null) => (max === null ? `≥ ${min} µm` : `${min}–${max} µm`);

/** Thirteen count inputs, one per ISO 16232 size class, named `${prefix}.B` … `${prefix}.N`. */
export function CountsGrid({ prefix, legend, defaults }: { prefix: string; legend: string; defaults?: Partial<Record<string, number>> }) {
  const { state } = useFormResult();
  const errors = state && !state.ok ? Object.entries(state.fieldErrors ?? {}).filter(([k]) => k.startsWith(`${prefix}.`)) : [];
  return (
    <fieldset className="space-y-1">
      <legend className="text-sm font-medium text-stone-800">{legend}</legend>
      <p className="text-xs text-stone-600">Absolute counts as found on the membrane (particles); leave a class empty when none was found.</p>
      <div className="grid grid-cols-4 gap-2 sm:grid-cols-7 lg:grid-cols-13">
        {SIZE_CLASSES.map((c) => (
          <label key={c.key} className="text-xs text-stone-700">
            <span className="block font-medium">{c.key}</span>
            <span className="block text-[10px] text-stone-500">{um(c.minUm, c.maxUm)}</span>
            <input
              name={`${prefix}.${c.key}`}
              inputMode="numeric"
              aria-label={`${legend}: class ${c.key} (${um(c.minUm, c.maxUm)}), particles`}
              defaultValue={defaults?.[c.key] ?? ""}
              aria-invalid={errors.some(([k]) => k === `${prefix}.${c.key}`) || undefined}
              className="mt-0.5 block w-full rounded border border-stone-300 px-1.5 py-1 text-sm tabular-nums aria-invalid:border-red-700"
            />
          </label>
        ))}
      </div>
      {errors.map(([k, msgs]) => (
        <p key={k} className="text-sm text-red-800">
          {msgs.join(" ")}
        </p>
      ))}
    </fieldset>
  );
}

function SampleIdentity() {
  return (
    <div className="grid gap-3 sm:grid-cols-3">
      <Field name="sampleLabel" label="Sample (part serial)" />
      <Field name="basketPosition" label="Basket position (optional)" placeholder="e.g. top left corner" />
      <label className="flex items-end gap-2 pb-2 text-sm">
        <input type="checkbox" name="worstCase" className="mb-0.5" /> Worst-case position
      </label>
    </div>
  );
}

function ParticleFields() {
  const [split, setSplit] = useState(false);
  return (
    <>
      <Field name="components" label="Components in the sample" inputMode="numeric" defaultValue="1" className="max-w-xs" hint="The area (or volume) of this many parts is the basis of the normalised counts." />
      <CountsGrid prefix="counts" legend="All particles" />
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" name="splitMeasured" checked={split} onChange={(e) => setSplit(e.target.checked)} /> Split by particle type measured
      </label>
      {split && (
        <div className="space-y-3 border-l-2 border-stone-200 pl-3">
          <CountsGrid prefix="metallic" legend="Metallic" />
          <CountsGrid prefix="nonMetallic" legend="Non-metallic" />
          <CountsGrid prefix="fibre" legend="Fibres" />
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-3">
        <Field name="largest.metallicUm" label="Largest metallic particle (µm)" inputMode="decimal" />
        <Field name="largest.nonMetallicUm" label="Largest non-metallic particle (µm)" inputMode="decimal" />
        <Field name="largest.fibreUm" label="Largest fibre (µm)" inputMode="decimal" />
      </div>
    </>
  );
}

function GravimetricFields() {
  return (
    <div className="grid gap-3 sm:grid-cols-4">
      <Field name="components" label="Components filtered" inputMode="numeric" defaultValue="1" />
      <Field name="filterBeforeMg" label="Filter mass before (mg)" inputMode="decimal" />
      <Field name="filterAfterMg" label="Filter mass after (mg)" inputMode="decimal" />
      <Field name="blankMg" label="Blank residue (mg, optional)" inputMode="decimal" />
    </div>
  );
}

function ObservationFields({ question }: { question: string }) {
  return (
    <>
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium text-stone-800">{question}</legend>
        <label className="mr-4 inline-flex items-center gap-1 text-sm">
          <input type="radio" name="acceptable" value="yes" /> Yes
        </label>
        <label className="inline-flex items-center gap-1 text-sm">
          <input type="radio" name="acceptable" value="no" /> No
        </label>
        <FieldError name="acceptable" />
      </fieldset>
      <Field name="observation" label="What was seen (optional)" />
      <p className="text-xs text-stone-600">Attach photos below; the run stays incomplete until at least one photo is attached.</p>
    </>
  );
}

const QUESTIONS = { visual: "Free of stains and visible residue?", uv_inspection: "Free of oil film under UV light?", dryness: "Dry?" } as const;

/** The entry form for one sample, with the fields of the run's test type; units are in every label. */
export function SampleForm({ action, runId, testType }: { action: Action; runId: string; testType: TestType }) {
  return (
    <ActionForm action={action} resetOnSuccess className="space-y-4 rounded-lg border border-stone-200 bg-white p-4" aria-label="Add a sample">
      <input type="hidden" name="runId" value={runId} />
      <SampleIdentity />
      {testType === "particle_cleanliness" && <ParticleFields />}
      {testType === "gravimetric" && <GravimetricFields />}
      {testType === "wetting_tension" && <Field name="readingsMNm" label="Test-ink readings (mN/m)" placeholder="e.g. 38, 40, 38" hint="Each reading is the ink that wets for about 2 s; separate with commas, decimals with a point." />}
      {testType === "rinse_conductivity" && (
        <div className="grid gap-3 sm:grid-cols-2">
          <Field name="measuredUsPerCm" label="Measured conductivity (µS/cm)" inputMode="decimal" />
          <Field name="temperatureC" label="Water temperature (°C)" inputMode="decimal" hint="Compensated to 25 °C when the outcome is computed." />
        </div>
      )}
      {(testType === "visual" || testType === "uv_inspection" || testType === "dryness") && <ObservationFields question={QUESTIONS[testType]} />}
      <SubmitButton>Add sample</SubmitButton>
    </ActionForm>
  );
}

/** Extraction series (declining test) and blank of a particle run. */
export function RunDataForm({ action, runId, defaults }: { action: Action; runId: string; defaults: { extractionSeries: number[]; blank: { counts: Record<string, number>; largestUm: number | null } | null } }) {
  const [blank, setBlank] = useState(defaults.blank !== null);
  return (
    <ActionForm action={action} className="space-y-4 rounded-lg border border-stone-200 bg-white p-4" aria-label="Extraction and blank">
      <input type="hidden" name="runId" value={runId} />
      <Field
        name="extractionSeries"
        label="Extraction series (particles per extraction)"
        defaultValue={defaults.extractionSeries.join(", ")}
        placeholder="e.g. 1250, 310, 84"
        hint="Counts of successive extractions of the same parts (declining test, up to 6); separate with commas."
      />
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" name="blankMeasured" checked={blank} onChange={(e) => setBlank(e.target.checked)} /> Blank value measured
      </label>
      {blank && (
        <>
          <CountsGrid prefix="blankCounts" legend="Blank" defaults={defaults.blank?.counts} />
          <Field name="blankLargestUm" label="Largest blank particle (µm)" inputMode="decimal" defaultValue={defaults.blank?.largestUm ?? ""} className="max-w-xs" />
        </>
      )}
      <SubmitButton>Save extraction and blank</SubmitButton>
    </ActionForm>
  );
}
