"use client";

import { ActionForm } from "@/components/ui/action-form";
import { DateField, Field, NumberField, TextareaField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";
import { rangeWithUnit } from "@/lib/format/number";

export interface CycleFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  system: string;
  recipe: string;
  parameters: {
    key: string;
    name: string;
    unit: string;
    validatedLow: number | null;
    validatedHigh: number | null;
    critical: boolean;
  }[];
  operator: string;
}

/** One wash cycle by hand: the recipe was chosen in the step before; its measured parameters are the value fields. */
export function CycleForm({ action, system, recipe, parameters, operator }: CycleFormProps) {
  return (
    <ActionForm
      action={action}
      aria-label="Record a wash cycle"
      className="space-y-4"
      resetOnSuccess
    >
      <input type="hidden" name="system" value={system} />
      <input type="hidden" name="recipe" value={recipe} />
      <div className="grid gap-3 sm:grid-cols-3">
        <Field
          name="cycleNumber"
          label="Cycle id"
          hint="As the washer's display or log prints it."
        />
        <Field name="partFamily" label="Part family code" placeholder="e.g. PF-VB-210" />
        <NumberField name="baskets" label="Baskets" integer />
      </div>
      <TextareaField
        name="lots"
        label="Lot numbers"
        hint="One or more, separated by spaces, commas or new lines."
        rows={2}
      />
      <div className="grid gap-3 sm:grid-cols-3">
        <DateField name="startedAt" label="Start (UTC)" withTime />
        <DateField name="endedAt" label="End (UTC)" withTime />
        <Field name="operator" label="Operator" defaultValue={operator} />
      </div>
      <fieldset className="rounded-lg border border-stone-200 p-3">
        <legend className="px-1 text-sm font-medium">Actual values</legend>
        <div className="grid gap-3 sm:grid-cols-3">
          {parameters.map((p) => (
            <NumberField
              key={p.key}
              name={`values.${p.key}`}
              label={p.name}
              unit={p.unit}
              hint={`Validated ${rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)}${p.critical ? " · critical" : ""}`}
              errorKey={`values.${p.key}`}
            />
          ))}
        </div>
      </fieldset>
      <SubmitButton>Record cycle</SubmitButton>
    </ActionForm>
  );
}
