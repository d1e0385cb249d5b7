"use client";

import { ActionForm } from "@/components/ui/action-form";
import { DateField, Field, NumberField, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { BATH_RECORD_KINDS, MAINTENANCE_KINDS } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { MAINTENANCE_LABELS } from "@/lib/evidence/maintenance";
import { dateTimeFieldValue } from "@/lib/format/date";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

export function BathRecordForm({ action, stageId }: { action: Action; stageId: string }) {
  return (
    <ActionForm
      action={action}
      resetOnSuccess
      className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-3"
      aria-label="Record in the bath log"
    >
      <input type="hidden" name="stageId" value={stageId} />
      <SelectField
        name="kind"
        label="What was done"
        defaultValue="reading"
        options={BATH_RECORD_KINDS.map((k) => ({ value: k, label: MAINTENANCE_LABELS[k] }))}
      />
      <DateField
        name="performedAt"
        label="When (UTC)"
        withTime
        defaultValue={dateTimeFieldValue()}
      />
      <Field
        name="filterDescription"
        label="Filter fitted (filter changes)"
        placeholder="e.g. bag filter 25 µm"
      />
      <NumberField name="concentrationPct" label="Detergent concentration (%)" />
      <NumberField name="conductivityUsPerCm" label="Bath conductivity (µS/cm)" />
      <NumberField name="temperatureC" label="Bath temperature (°C)" />
      <NumberField name="countPerMl4" label="Particles ≥ 4 µm(c) per mL" />
      <NumberField name="countPerMl6" label="Particles ≥ 6 µm(c) per mL" />
      <NumberField
        name="countPerMl14"
        label="Particles ≥ 14 µm(c) per mL"
        hint="The ISO 4406 code is computed from the three counts."
      />
      <Field name="notes" label="Notes" className="sm:col-span-3" />
      <div className="sm:col-span-3">
        <SubmitButton>Record</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function IntervalForm({ action, stageId }: { action: Action; stageId: string }) {
  return (
    <ActionForm
      action={action}
      className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-5 sm:items-end"
      aria-label="Set a maintenance interval"
    >
      <input type="hidden" name="stageId" value={stageId} />
      <SelectField
        name="kind"
        label="Maintenance"
        options={MAINTENANCE_KINDS.map((k) => ({ value: k, label: MAINTENANCE_LABELS[k] }))}
      />
      <NumberField name="intervalDays" label="Every (days)" integer />
      <NumberField name="warnDays" label="Show as due (days before)" integer defaultValue="2" />
      <Field
        name="reason"
        label="Reason for a change"
        hint="Needed when the interval already exists."
      />
      <SubmitButton variant="secondary">Save interval</SubmitButton>
    </ActionForm>
  );
}
