"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field, NumberField, SelectField, TextareaField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { WETTED_AREA_METHODS } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";

export const WETTED_AREA_METHOD_LABELS: Record<(typeof WETTED_AREA_METHODS)[number], string> = {
  cad_model: "From the CAD model",
  measured: "Measured",
  calculated: "Calculated from the drawing",
  estimated: "Estimated",
};

export interface PartFamilyValues {
  id?: string;
  code: string;
  name: string;
  partNumbers: string[];
  material: string;
  wettedAreaCm2: number | null;
  wettedAreaMethod: string | null;
  wettedAreaNote: string | null;
  wettedVolumeCm3: number | null;
  drawingNumber: string | null;
  drawingRevision: string | null;
  customer: string | null;
  specId: string;
  description: string | null;
}

const text = (v: string | number | null | undefined) =>
  v === null || v === undefined ? "" : String(v);

/**
 * Creates or edits a part family. A family already used by runs or qualified combinations asks for
 * the reason up front (the service refuses the edit without one), so the engineer is not surprised.
 */
export function PartFamilyForm({
  action,
  values,
  specs,
  inUse = false,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  values?: PartFamilyValues;
  specs: { id: string; code: string; revision: string; name: string }[];
  inUse?: boolean;
}) {
  const editing = Boolean(values?.id);
  return (
    <ActionForm
      action={action}
      className="max-w-3xl space-y-6"
      aria-label={editing ? "Edit part family" : "New part family"}
    >
      {values?.id && <input type="hidden" name="partFamilyId" value={values.id} />}
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Identity</legend>
        <Field
          name="code"
          label="Family code"
          defaultValue={text(values?.code)}
          hint="Letters, digits and . _ / - ; unique in the plant."
        />
        <Field name="name" label="Name" defaultValue={text(values?.name)} />
        <TextareaField
          name="partNumbers"
          label="Part numbers"
          rows={2}
          defaultValue={values?.partNumbers.join(", ") ?? ""}
          hint="Separated by commas or one per line. A part number belongs to one family only."
          className="sm:col-span-2"
        />
        <Field name="customer" label="Customer (optional)" defaultValue={text(values?.customer)} />
        <Field
          name="material"
          label="Material"
          defaultValue={text(values?.material)}
          hint="Alloy and state, e.g. Aluminium EN AC-46000, machined."
        />
        <Field
          name="drawingNumber"
          label="Drawing number (optional)"
          defaultValue={text(values?.drawingNumber)}
        />
        <Field
          name="drawingRevision"
          label="Drawing revision (optional)"
          defaultValue={text(values?.drawingRevision)}
        />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Wetted surface</legend>
        <NumberField
          name="wettedAreaCm2"
          label="Wetted area per part (cm²)"
          unit="cm²"
          defaultValue={text(values?.wettedAreaCm2)}
          hint="Every per-1000 cm² limit is scaled by it."
        />
        <SelectField
          name="wettedAreaMethod"
          label="How the area was determined"
          defaultValue={text(values?.wettedAreaMethod)}
          placeholder="Choose…"
          options={WETTED_AREA_METHODS.map((m) => ({
            value: m,
            label: WETTED_AREA_METHOD_LABELS[m],
          }))}
        />
        <NumberField
          name="wettedVolumeCm3"
          label="Wetted volume per part (cm³, optional)"
          unit="cm³"
          defaultValue={text(values?.wettedVolumeCm3)}
        />
        <Field
          name="wettedAreaNote"
          label="Area note (optional)"
          defaultValue={text(values?.wettedAreaNote)}
          hint="e.g. CAD model rev F, internal bores included."
        />
      </fieldset>
      <fieldset className="grid gap-4">
        <legend className="mb-2 text-base font-semibold">Specification</legend>
        <SelectField
          name="specId"
          label="Specification in force"
          defaultValue={text(values?.specId)}
          placeholder="Choose…"
          options={specs.map((s) => ({
            value: s.id,
            label: `${s.code} rev ${s.revision} · ${s.name}`,
          }))}
          hint="Only revisions in force can be chosen; a new revision moves its families itself."
        />
        <TextareaField
          name="description"
          label="Description (optional)"
          rows={3}
          defaultValue={text(values?.description)}
        />
      </fieldset>
      {editing && (
        <TextareaField
          name="reason"
          label={inUse ? "Reason for the change" : "Reason for the change (optional)"}
          rows={2}
          hint={
            inUse
              ? "Test runs or qualified recipes already refer to this family: say why it changes."
              : undefined
          }
        />
      )}
      <SubmitButton pendingText="Saving…">
        {editing ? "Save part family" : "Create part family"}
      </SubmitButton>
    </ActionForm>
  );
}
