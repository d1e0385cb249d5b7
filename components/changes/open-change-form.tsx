"use client";

import { ActionForm } from "@/components/ui/action-form";
import { Field, FieldError } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { CHANGE_KINDS } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { CHANGE_KIND_LABELS } from "@/lib/changes/workflow";

export function OpenChangeForm({ action, recipeId, version }: { action: (prev: FormState, formData: FormData) => Promise<FormState>; recipeId: string; version: number }) {
  return (
    <ActionForm action={action} className="space-y-3" aria-label="Open a change request">
      <input type="hidden" name="recipeId" value={recipeId} />
      <Field name="title" label="What should change" placeholder="e.g. Raise wash temperature for heavier chip load" />
      <fieldset>
        <legend className="text-sm font-medium text-stone-800">Kind of change</legend>
        <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
          {CHANGE_KINDS.map((k, i) => (
            <label key={k} className="flex items-center gap-1.5 text-sm">
              <input type="radio" name="kind" value={k} defaultChecked={i === 0} /> {CHANGE_KIND_LABELS[k]}
            </label>
          ))}
        </div>
        <FieldError name="kind" />
      </fieldset>
      <SubmitButton>Open change request against version {version}</SubmitButton>
    </ActionForm>
  );
}
