"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Field, NumberField, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { DOCUMENT_TYPES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";

export interface NewDocumentFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  options: {
    systems: { id: string; code: string; name: string }[];
    families: { id: string; code: string; name: string }[];
    recipes: {
      id: string;
      code: string;
      name: string;
      version: number;
      status: string;
      systemId: string;
    }[];
  };
}

export function NewDocumentForm({ action, options }: NewDocumentFormProps) {
  const [systemId, setSystemId] = useState("");
  const recipes = options.recipes.filter((r) => r.systemId === systemId);
  return (
    <ActionForm action={action} className="max-w-2xl space-y-4" aria-label="New document">
      <SelectField
        name="type"
        label="Kind of document"
        defaultValue="pq_protocol"
        options={DOCUMENT_TYPES.filter((t) => t !== "change_narrative").map((t) => ({
          value: t,
          label: TYPE_LABELS[t],
        }))}
      />
      <Field
        name="title"
        label="Title"
        placeholder="e.g. PQ of the valve-body recipe on the three-tank washer"
      />
      <SelectField
        name="systemId"
        label="Cleaning system"
        placeholder="— none —"
        value={systemId}
        onValueChange={setSystemId}
        options={options.systems.map((s) => ({ value: s.id, label: `${s.code} — ${s.name}` }))}
      />
      <SelectField
        name="partFamilyId"
        label="Part family"
        placeholder="— none —"
        options={options.families.map((f) => ({ value: f.id, label: `${f.code} — ${f.name}` }))}
      />
      <SelectField
        key={systemId}
        name="recipeVersionId"
        label="Recipe version"
        placeholder={systemId ? "— none —" : "— choose a cleaning system first —"}
        disabled={!systemId}
        options={recipes.map((r) => ({
          value: r.id,
          label: `${r.code} version ${r.version} (${r.status}) — ${r.name}`,
        }))}
      />
      <fieldset className="grid grid-cols-2 gap-4">
        <legend className="mb-1 text-sm font-medium text-stone-800">
          Sample plan (success-run, zero failures)
        </legend>
        <NumberField name="confidencePct" label="Confidence (%)" defaultValue="95" />
        <NumberField name="reliabilityPct" label="Reliability (%)" defaultValue="90" />
      </fieldset>
      <SubmitButton pendingText="Creating…">Create draft from template</SubmitButton>
    </ActionForm>
  );
}
