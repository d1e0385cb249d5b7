"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field, NumberField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

/** How often one validated recipe version × part family is requalified. */
export function IntervalForm({
  action,
  intervalId,
  months,
  family,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  intervalId: string;
  months: number;
  family: string;
}) {
  return (
    <ActionForm
      action={action}
      className="mt-2 grid gap-2 sm:grid-cols-[8rem_1fr_auto] sm:items-end"
      aria-label={`Requalification interval for ${family}`}
    >
      <input type="hidden" name="intervalId" value={intervalId} />
      <NumberField name="intervalMonths" label="Every (months)" defaultValue={months} integer />
      <Field name="reason" label="Reason" />
      <SubmitButton variant="secondary">Save</SubmitButton>
    </ActionForm>
  );
}
