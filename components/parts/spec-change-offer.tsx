"use client";

import { IntentLink } from "@/components/ui/intent-link";
import { ActionForm } from "@/components/ui/action-form";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

/** One click per qualified recipe: the change request a revised specification calls for, prefilled. */
export function SpecChangeOffer({
  action,
  specId,
  recipe,
  canOpen,
}: {
  action: Action;
  specId: string;
  recipe: {
    recipeId: string;
    code: string;
    version: number;
    changeRequest: { id: string; number: string } | null;
  };
  canOpen: boolean;
}) {
  if (recipe.changeRequest)
    return (
      <IntentLink href={`/changes/${recipe.changeRequest.id}`} className="text-brand-800 underline">
        {recipe.changeRequest.number}
      </IntentLink>
    );
  if (!canOpen) return <span className="text-stone-500">No change request yet</span>;
  const label = `Open change request on ${recipe.code}`;
  return (
    <ActionForm action={action} aria-label={label}>
      <input type="hidden" name="specId" value={specId} />
      <input type="hidden" name="recipeId" value={recipe.recipeId} />
      <SubmitButton variant="secondary">{label}</SubmitButton>
    </ActionForm>
  );
}
