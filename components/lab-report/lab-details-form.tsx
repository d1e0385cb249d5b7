"use client";

import type { MethodPrefill } from "@/lib/lab-methods/prefill";
import { ActionForm } from "@/components/ui/action-form";
import { Field, NumberField, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { WETTED_AREA_METHODS } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import {
  ANALYSIS_SYSTEM_LABELS,
  ANALYSIS_SYSTEMS,
  EXTRACTION_PROCEDURE_LABELS,
  EXTRACTION_PROCEDURES,
  PARTICLE_TYPE_LABELS,
  PARTICLE_TYPES,
  WETTED_AREA_METHOD_LABELS,
  type LabDetails,
} from "@/lib/schemas/lab-details";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

const options = <K extends string>(keys: readonly K[], labels: Record<K, string>) =>
  keys.map((value) => ({ value, label: labels[value] }));
const str = (v: number | string | null | undefined) =>
  v === null || v === undefined ? "" : String(v);

/**
 * How the run was extracted and analysed and on which parts: what its test report carries. Saved
 * whole; the values become part of the run's signed content.
 */
export function LabDetailsForm({
  action,
  runId,
  details,
  fallback,
  files,
  sampleLabels,
  fromMethods,
}: {
  action: Action;
  runId: string;
  details: LabDetails | null;
  /** The cited methods' values, offered until the run records its own details. */
  fromMethods?: MethodPrefill;
  /** The part family's own values, offered until the run records its own. */
  fallback: {
    drawingRevision: string | null;
    wettedAreaCm2: number;
    wettedAreaMethod: string | null;
  };
  /** Photos and membrane images attached to the run. */
  files: { id: string; name: string }[];
  sampleLabels: string[];
}) {
  const d = details;
  const ex = d?.extraction ?? fromMethods?.extraction;
  const fi = d?.filter ?? fromMethods?.filter;
  const an = d?.analysis ?? fromMethods?.analysis;
  return (
    <ActionForm
      action={action}
      className="space-y-5 rounded-lg border border-stone-200 bg-white p-4"
      aria-label="Extraction and analysis"
    >
      <input type="hidden" name="runId" value={runId} />
      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-stone-800">Components tested</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <Field
            name="component.drawingRevision"
            label="Drawing revision"
            defaultValue={d?.component.drawingRevision ?? fallback.drawingRevision ?? ""}
          />
          <Field name="component.lot" label="Lot" defaultValue={d?.component.lot ?? ""} />
          <NumberField
            name="component.wettedAreaCm2"
            label="Wetted area per component"
            unit="cm²"
            defaultValue={str(d?.component.wettedAreaCm2 ?? fallback.wettedAreaCm2)}
            hint="The counts are normalised to the wetted area of the parts tested."
          />
          <SelectField
            name="component.wettedAreaMethod"
            label="Wetted area determined"
            placeholder="Choose…"
            options={options(WETTED_AREA_METHODS, WETTED_AREA_METHOD_LABELS)}
            defaultValue={d?.component.wettedAreaMethod ?? fallback.wettedAreaMethod ?? ""}
          />
        </div>
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-stone-800">Extraction</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <SelectField
            name="extraction.procedure"
            label="Extraction procedure"
            placeholder="Choose…"
            options={options(EXTRACTION_PROCEDURES, EXTRACTION_PROCEDURE_LABELS)}
            defaultValue={ex?.procedure ?? ""}
          />
          <Field
            name="extraction.liquid"
            label="Extraction liquid"
            placeholder="e.g. filtered cold cleaner, neutral aqueous solution"
            defaultValue={ex?.liquid ?? ""}
          />
          <NumberField
            name="extraction.volumeMl"
            label="Liquid volume"
            unit="mL"
            defaultValue={str(ex?.volumeMl)}
          />
          <NumberField
            name="extraction.pressureBar"
            label="Pressure"
            unit="bar"
            hint="Needed for pressure and internal rinsing."
            defaultValue={str(ex?.pressureBar)}
          />
          <NumberField
            name="extraction.flowLPerMin"
            label="Flow (optional)"
            unit="L/min"
            defaultValue={str(ex?.flowLPerMin)}
          />
          <NumberField
            name="extraction.durationS"
            label="Extraction time"
            unit="s"
            defaultValue={str(ex?.durationS)}
          />
          <Field
            name="extraction.controlledSurface"
            label="Controlled surface"
            placeholder="e.g. all wetted internal surfaces, sealing faces excluded"
            defaultValue={ex?.controlledSurface ?? ""}
          />
          <NumberField
            name="extraction.extractions"
            label="Number of extractions"
            integer
            defaultValue={str(ex?.extractions)}
          />
        </div>
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-stone-800">Filter and analysis</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <Field
            name="filter.material"
            label="Filter membrane material"
            placeholder="e.g. PET mesh, cellulose nitrate"
            defaultValue={fi?.material ?? ""}
          />
          <NumberField
            name="filter.poreSizeUm"
            label="Pore size"
            unit="µm"
            defaultValue={str(fi?.poreSizeUm)}
          />
          <SelectField
            name="analysis.system"
            label="Analysis system"
            placeholder="Choose…"
            options={options(ANALYSIS_SYSTEMS, ANALYSIS_SYSTEM_LABELS)}
            defaultValue={an?.system ?? ""}
          />
          <NumberField
            name="analysis.magnification"
            label="Magnification"
            unit="×"
            defaultValue={str(an?.magnification)}
          />
          <NumberField
            name="analysis.lowerSizeLimitUm"
            label="Lower size limit"
            unit="µm"
            hint="Size classes below it are reported as not analysed."
            defaultValue={str(an?.lowerSizeLimitUm)}
          />
        </div>
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-stone-800">Largest particles by type</legend>
        <p className="text-xs text-stone-600">
          With a light microscope “metallic” means reflective; only SEM/EDX confirms the material.
          Leave a type empty when none was measured.
        </p>
        {PARTICLE_TYPES.map((type) => {
          const p = d?.largest[type];
          const name = PARTICLE_TYPE_LABELS[type];
          return (
            <div key={type} className="grid gap-3 sm:grid-cols-4">
              <NumberField
                name={`largest.${type}.lengthUm`}
                label={`${name}: length`}
                unit="µm"
                defaultValue={str(p?.lengthUm)}
              />
              <NumberField
                name={`largest.${type}.widthUm`}
                label={`${name}: width`}
                unit="µm"
                defaultValue={str(p?.widthUm)}
              />
              <SelectField
                name={`largest.${type}.sampleLabel`}
                label={`${name}: sample`}
                placeholder="—"
                options={sampleLabels.map((l) => ({ value: l, label: l }))}
                defaultValue={p?.sampleLabel ?? ""}
              />
              <SelectField
                name={`largest.${type}.photoFileId`}
                label={`${name}: photo`}
                placeholder="None attached"
                options={files.map((f) => ({ value: f.id, label: f.name }))}
                defaultValue={p?.photoFileId ?? ""}
              />
            </div>
          );
        })}
      </fieldset>
      <SubmitButton>Save extraction and analysis</SubmitButton>
    </ActionForm>
  );
}
