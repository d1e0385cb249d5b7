"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

export interface InitialValidationFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  recipeId: string;
  families: { id: string; code: string; name: string }[];
}

/** Routes a new recipe's draft first version through its initial validation for one part family. */
export function InitialValidationForm({ action, recipeId, families }: InitialValidationFormProps) {
  return (
    <ActionForm action={action} className="space-y-3" aria-label="Route for initial validation">
      <input type="hidden" name="recipeId" value={recipeId} />
      <Field
        name="title"
        label="Validation title"
        placeholder="e.g. Initial validation for manifold blocks"
      />
      <SelectField
        name="partFamilyId"
        label="Part family validated for"
        placeholder="Choose…"
        options={families.map((f) => ({ value: f.id, label: `${f.code} ${f.name}` }))}
      />
      <SubmitButton>Route for initial validation</SubmitButton>
    </ActionForm>
  );
}
