"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { DateField, Field, NumberField, SelectField } from "@/components/ui/field";
import { StoredFileUpload } from "@/components/ui/stored-file-upload";
import { SubmitButton } from "@/components/ui/submit-button";
import { BATH_CHEMISTRY_KEYS, BATH_RECORD_KINDS, MAINTENANCE_KINDS } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { BATH_CHEMISTRY } from "@/lib/bath/limits";
import { MAINTENANCE_LABELS } from "@/lib/evidence/maintenance";
import { dateTimeFieldValue } from "@/lib/format/date";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;
type Option = { value: string; label: string };

export function BathRecordForm({
  action,
  stageId,
  detergents,
}: {
  action: Action;
  stageId: string;
  detergents: Option[];
}) {
  const [kind, setKind] = useState<string>("reading");
  const measures = kind === "reading" || kind === "bath_change" || kind === "addition";
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
        value={kind}
        onValueChange={setKind}
        options={BATH_RECORD_KINDS.map((k) => ({ value: k, label: MAINTENANCE_LABELS[k] }))}
      />
      <DateField
        name="performedAt"
        label="When (UTC)"
        withTime
        defaultValue={dateTimeFieldValue()}
      />
      <SelectField
        name="detergentId"
        label="Detergent"
        placeholder="As in the tank's plan"
        options={detergents}
        hint="Its titration factor turns the titrant volume into a concentration."
      />
      {measures && (
        <>
          <NumberField
            name="titrantVolumeMl"
            label="Titrant volume (mL)"
            unit="mL"
            hint="Concentration = volume × the detergent's factor."
          />
          <NumberField
            name="concentrationPct"
            label="Detergent concentration (%)"
            hint="Or type it when measured another way."
          />
          <NumberField name="ph" label="pH" />
          <NumberField name="temperatureC" label="Bath temperature (°C)" />
          <NumberField name="conductivityUsPerCm" label="Bath conductivity (µS/cm)" />
          <NumberField name="oilContentGPerL" label="Oil content (g/L)" />
          <NumberField name="countPerMl4" label="Particles ≥ 4 µm(c) per mL" />
          <NumberField name="countPerMl6" label="Particles ≥ 6 µm(c) per mL" />
          <NumberField
            name="countPerMl14"
            label="Particles ≥ 14 µm(c) per mL"
            hint="The ISO 4406 code is computed from the three counts."
          />
        </>
      )}
      {kind === "addition" && (
        <>
          <NumberField name="additionQuantity" label="Quantity added" />
          <SelectField
            name="additionUnit"
            label="Unit of the quantity"
            defaultValue="L"
            options={[
              { value: "L", label: "L" },
              { value: "kg", label: "kg" },
            ]}
          />
          <Field name="additionLot" label="Detergent lot" />
        </>
      )}
      {kind === "filter_change" && (
        <>
          <Field
            name="filterDescription"
            label="Filter fitted"
            placeholder="e.g. bag filter, polypropylene"
          />
          <NumberField name="filterRatingUm" label="Filter rating (µm)" unit="µm" />
          <NumberField
            name="differentialPressureBar"
            label="Differential pressure before the change (bar)"
            unit="bar"
          />
        </>
      )}
      {(kind === "nozzle_check" || kind === "ultrasonic_foil_test") && (
        <>
          <SelectField
            name="checkResult"
            label="Result"
            placeholder="Choose…"
            options={[
              { value: "pass", label: "Pass" },
              { value: "fail", label: "Fail" },
            ]}
          />
          <StoredFileUpload
            endpoint="/api/bath/photos"
            name="photoFileId"
            label="Photo"
            accept=".jpg,.jpeg,.png"
            hint="The foil or the spray pattern; kept by its SHA-256 hash."
            what="photo"
          />
        </>
      )}
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

/** One line of the tank's measurement plan; blank reject limits take the recipe's validated range. */
export function BathLimitForm({
  action,
  stageId,
  versions,
  detergents,
}: {
  action: Action;
  stageId: string;
  versions: Option[];
  detergents: Option[];
}) {
  return (
    <ActionForm
      action={action}
      className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-4"
      aria-label="Set a plan line"
    >
      <input type="hidden" name="stageId" value={stageId} />
      <SelectField
        name="variable"
        label="Value"
        options={BATH_CHEMISTRY_KEYS.map((k) => ({
          value: k,
          label: `${BATH_CHEMISTRY[k].label} (${BATH_CHEMISTRY[k].unit})`,
        }))}
      />
      <SelectField
        name="recipeVersionId"
        label="Recipe version in force"
        options={versions}
        placeholder={versions.length === 0 ? "No effective recipe on this washer" : undefined}
      />
      <SelectField
        name="detergentId"
        label="Detergent (concentration)"
        placeholder="None"
        options={detergents}
      />
      <NumberField name="target" label="Target" />
      <NumberField name="actionLow" label="Action low" />
      <NumberField name="actionHigh" label="Action high" />
      <NumberField
        name="rejectLow"
        label="Reject low"
        hint="Blank: the recipe's validated low, where it has one."
      />
      <NumberField
        name="rejectHigh"
        label="Reject high"
        hint="Blank: the recipe's validated high, where it has one."
      />
      <div className="sm:col-span-4">
        <SubmitButton variant="secondary">Save plan line</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function DetergentForm({ action }: { action: Action }) {
  return (
    <ActionForm
      action={action}
      resetOnSuccess
      className="grid gap-3 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-4 sm:items-end"
      aria-label="Add a detergent"
    >
      <Field name="name" label="Detergent" hint="The same name again changes its factor." />
      <Field name="supplier" label="Supplier" />
      <Field
        name="titrationMethod"
        label="Titration method"
        placeholder="e.g. 10 mL sample, 0.1 mol/L HCl, phenolphthalein"
      />
      <NumberField
        name="factorPctPerMl"
        label="Titration factor (% per mL)"
        hint="From the supplier's data sheet."
      />
      <div className="sm:col-span-4">
        <SubmitButton variant="secondary">Save detergent</SubmitButton>
      </div>
    </ActionForm>
  );
}
