"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import {
  CheckboxField,
  DateField,
  Field,
  FieldError,
  NumberField,
  SelectField,
  TextareaField,
} from "@/components/ui/field";
import { AddRowButton, PayloadField, RemoveRowButton, useRowList } from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import { RISK_LABELS, RISK_LEVELS } from "@/lib/deviations/rules";
import { rangeWithUnit } from "@/lib/format/number";
import type { FormState } from "@/lib/actions/result";

interface RecipeOption {
  id: string;
  label: string;
  parameters: {
    key: string;
    label: string;
    unit: string;
    validatedLow: number | null;
    validatedHigh: number | null;
  }[];
}

interface ParameterRow {
  key: string;
  temporaryLow: string;
  temporaryHigh: string;
}

/** The new-deviation form: the whole form is one payload, so nothing typed is lost on a refusal. */
export function DeviationForm({
  action,
  recipes,
  families,
  today,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  recipes: RecipeOption[];
  families: { value: string; label: string }[];
  today: string;
}) {
  const [fields, setFields] = useState({
    recipeId: "",
    title: "",
    justification: "",
    riskLevel: "",
    risk: "",
    endsOn: "",
    maxLots: "",
    reminderDays: "3",
  });
  const [familyIds, setFamilyIds] = useState<string[]>([]);
  const params = useRowList<ParameterRow>(() => [{ key: "", temporaryLow: "", temporaryHigh: "" }]);
  const set = (name: keyof typeof fields) => (value: string) =>
    setFields((f) => ({ ...f, [name]: value }));
  const recipe = recipes.find((r) => r.id === fields.recipeId);
  const payload = {
    ...fields,
    partFamilyIds: familyIds,
    parameters: params.values,
  };
  return (
    <ActionForm action={action} aria-label="New deviation" className="max-w-3xl space-y-5">
      <PayloadField value={payload} />
      <SelectField
        label="Recipe"
        errorKey="recipeId"
        placeholder="Choose…"
        value={fields.recipeId}
        onValueChange={set("recipeId")}
        options={recipes.map((r) => ({ value: r.id, label: r.label }))}
        hint="Its effective version's validated ranges are what the deviation departs from."
      />
      <Field label="Title" errorKey="title" value={fields.title} onValueChange={set("title")} />
      <TextareaField
        label="Justification"
        errorKey="justification"
        rows={4}
        value={fields.justification}
        onValueChange={set("justification")}
        hint="Why production must run outside the validated range, e.g. a substitute detergent while the usual one is unavailable."
      />
      <div className="grid gap-4 sm:grid-cols-[12rem_1fr]">
        <SelectField
          label="Risk level"
          errorKey="riskLevel"
          placeholder="Choose…"
          value={fields.riskLevel}
          onValueChange={set("riskLevel")}
          options={RISK_LEVELS.map((r) => ({ value: r, label: RISK_LABELS[r] }))}
        />
        <TextareaField
          label="Risk and how it is contained"
          errorKey="risk"
          value={fields.risk}
          onValueChange={set("risk")}
        />
      </div>

      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-stone-800">Part families</legend>
        {families.map((f) => (
          <CheckboxField
            key={f.value}
            label={f.label}
            checked={familyIds.includes(f.value)}
            onCheckedChange={(on) =>
              setFamilyIds((ids) => (on ? [...ids, f.value] : ids.filter((i) => i !== f.value)))
            }
          />
        ))}
        <FieldError name="partFamilyIds" />
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="text-sm font-medium text-stone-800">
          Parameters and temporary ranges
        </legend>
        {!recipe && <p className="text-sm text-stone-600">Choose the recipe first.</p>}
        {params.rows.map((row, i) => {
          const p = recipe?.parameters.find((x) => x.key === row.value.key);
          const n = i + 1;
          return (
            <div
              key={row.key}
              className="grid items-start gap-3 rounded-md border border-stone-200 p-3 sm:grid-cols-[1fr_auto_auto_auto]"
            >
              <SelectField
                label={`Parameter ${n}`}
                errorKey={`parameters.${i}.key`}
                placeholder="Choose…"
                value={row.value.key}
                onValueChange={(key) => params.update(i, { key })}
                options={(recipe?.parameters ?? []).map((x) => ({ value: x.key, label: x.label }))}
                hint={
                  p
                    ? `Validated ${rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)}`
                    : undefined
                }
              />
              <NumberField
                label={`Temporary low ${n}`}
                unit={p?.unit}
                errorKey={`parameters.${i}.temporaryLow`}
                value={row.value.temporaryLow}
                onValueChange={(temporaryLow) => params.update(i, { temporaryLow })}
              />
              <NumberField
                label={`Temporary high ${n}`}
                unit={p?.unit}
                errorKey={`parameters.${i}.temporaryHigh`}
                value={row.value.temporaryHigh}
                onValueChange={(temporaryHigh) => params.update(i, { temporaryHigh })}
              />
              <div className="pt-6">
                <RemoveRowButton
                  label={`Remove parameter ${n}`}
                  onRemove={() => params.remove(i)}
                />
              </div>
            </div>
          );
        })}
        <FieldError name="parameters" />
        <AddRowButton onAdd={() => params.add({ key: "", temporaryLow: "", temporaryHigh: "" })}>
          Add a parameter
        </AddRowButton>
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-3">
        <legend className="mb-2 text-sm font-medium text-stone-800">
          Limits: an end date, a number of lots, or both
        </legend>
        <DateField
          label="Last day"
          errorKey="endsOn"
          min={today}
          value={fields.endsOn}
          onValueChange={set("endsOn")}
        />
        <NumberField
          label="Lots at most"
          integer
          errorKey="maxLots"
          value={fields.maxLots}
          onValueChange={set("maxLots")}
        />
        <NumberField
          label="Remind days before the end"
          integer
          errorKey="reminderDays"
          value={fields.reminderDays}
          onValueChange={set("reminderDays")}
        />
      </fieldset>
      <SubmitButton>Save draft</SubmitButton>
    </ActionForm>
  );
}
