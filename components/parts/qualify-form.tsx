"use client";

import { ActionForm } from "@/components/ui/action-form";
import { DateField, NumberField, SelectField, TextareaField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

/** Records by hand that a recipe version in use is validated for a part family, and on what evidence. */
export function QualifyForm({
  action,
  versions,
  families,
  today,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  versions: { id: string; code: string; name: string; version: number; status: string }[];
  families: { id: string; code: string; name: string }[];
  today: string;
}) {
  return (
    <ActionForm
      action={action}
      resetOnSuccess
      className="grid max-w-3xl gap-4 rounded-lg border border-stone-200 bg-white p-4 sm:grid-cols-2"
      aria-label="Qualify a combination"
    >
      <SelectField
        name="recipeVersionId"
        label="Recipe version"
        placeholder="Choose…"
        options={versions.map((v) => ({
          value: v.id,
          label: `${v.code} v${v.version} (${v.status}) · ${v.name}`,
        }))}
        hint="Effective or earlier versions; a new version is qualified when its change or validation closes."
      />
      <SelectField
        name="partFamilyId"
        label="Part family"
        placeholder="Choose…"
        options={families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` }))}
      />
      <TextareaField
        name="basis"
        label="Basis of the qualification"
        rows={2}
        className="sm:col-span-2"
        hint="The validation report, change request or run numbers that prove it."
      />
      <DateField name="qualifiedOn" label="Qualified on" defaultValue={today} />
      <NumberField
        name="intervalMonths"
        label="Requalification interval (months)"
        unit="months"
        integer
        defaultValue="12"
      />
      <div className="sm:col-span-2">
        <SubmitButton pendingText="Saving…">Qualify combination</SubmitButton>
      </div>
    </ActionForm>
  );
}
