"use client";

import { ActionForm } from "@/components/ui/action-form";
import { ChoiceGroup, Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";
import { CHANGE_KIND_LABELS, CHANGE_KINDS_FOR_EFFECTIVE } from "@/lib/changes/workflow";

export function OpenChangeForm({
  action,
  recipeId,
  version,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  recipeId: string;
  version: number;
}) {
  return (
    <ActionForm action={action} className="space-y-3" aria-label="Open a change request">
      <input type="hidden" name="recipeId" value={recipeId} />
      <Field
        name="title"
        label="What should change"
        placeholder="e.g. Raise wash temperature for heavier chip load"
      />
      <ChoiceGroup
        type="radio"
        name="kind"
        legend="Kind of change"
        inline
        defaultValues={[CHANGE_KINDS_FOR_EFFECTIVE[0]]}
        options={CHANGE_KINDS_FOR_EFFECTIVE.map((k) => ({
          value: k,
          label: CHANGE_KIND_LABELS[k],
        }))}
      />
      <SubmitButton>Open change request against version {version}</SubmitButton>
    </ActionForm>
  );
}
