"use client";

import { ActionForm } from "@/components/ui/action-form";
import { DateField, Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { TEST_TYPES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { humanize } from "@/lib/format/labels";
import { todayUtc } from "@/lib/format/date";
import type { RunDefaults } from "@/lib/evidence/run-defaults";

export interface RunFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  options: {
    families: { id: string; code: string; name: string }[];
    versions: { id: string; label: string }[];
    technicians: { id: string; name: string }[];
    protocols: { id: string; number: string; title: string }[];
    changes: { id: string; number: string; title: string }[];
  };
  defaultTechnicianId?: string;
  /** Filled in when the form is opened from a change request's gate. */
  defaults?: RunDefaults;
}

export function RunForm({ action, options, defaultTechnicianId, defaults = {} }: RunFormProps) {
  return (
    <ActionForm
      action={action}
      className="grid max-w-3xl gap-4 sm:grid-cols-2"
      aria-label="New test run"
    >
      <SelectField
        name="partFamilyId"
        label="Part family"
        placeholder="Choose…"
        defaultValue={defaults.partFamilyId}
        options={options.families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` }))}
      />
      <SelectField
        name="recipeVersionId"
        label="Recipe version"
        placeholder="Choose…"
        defaultValue={defaults.recipeVersionId}
        options={options.versions.map((v) => ({ value: v.id, label: v.label }))}
      />
      <SelectField
        name="testType"
        label="Test type"
        placeholder="Choose…"
        defaultValue={defaults.testType}
        options={TEST_TYPES.map((t) => ({ value: t, label: humanize(t) }))}
      />
      <SelectField
        name="technicianId"
        label="Technician"
        placeholder="Choose…"
        defaultValue={defaultTechnicianId}
        options={options.technicians.map((t) => ({ value: t.id, label: t.name }))}
      />
      <Field name="lab" label="Analysing lab" placeholder="e.g. Larchfield cleanliness lab" />
      <DateField name="performedOn" label="Test date" defaultValue={todayUtc()} />
      <SelectField
        name="protocolDocumentId"
        label="Protocol (optional)"
        placeholder="None"
        options={options.protocols.map((p) => ({ value: p.id, label: `${p.number} · ${p.title}` }))}
      />
      <SelectField
        name="changeRequestId"
        label="Change request (optional)"
        placeholder="None"
        defaultValue={defaults.changeRequestId}
        options={options.changes.map((c) => ({ value: c.id, label: `${c.number} · ${c.title}` }))}
      />
      <Field
        name="requirement"
        label="Requirement of the change request (optional)"
        className="sm:col-span-2"
        defaultValue={defaults.requirement}
        hint="The required requalification test this run answers, in the change request's words."
      />
      <div className="sm:col-span-2">
        <SubmitButton>Open test run</SubmitButton>
      </div>
    </ActionForm>
  );
}
