"use client";

import { ActionForm, useFormResult } from "@/components/ui/action-form";
import { ChoiceGroup, Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { createApiTokenAction, revokeApiTokenAction } from "@/app/(app)/account/tokens/actions";
import { DEFAULT_TOKEN_DAYS, SCOPE_LABELS, TOKEN_LIFETIMES_DAYS } from "@/lib/schemas/api-token";

/** Shows a new token once: only its hash is kept, so it cannot be shown again. */
function NewToken() {
  const { state } = useFormResult();
  const token = state && state.ok ? (state as { token?: string }).token : undefined;
  if (!token) return null;
  return (
    <div
      role="status"
      aria-label="New API token"
      className="rounded-md border border-brand-300 bg-brand-50 p-4 text-sm"
    >
      <p className="font-medium text-brand-900">Your new token (shown once)</p>
      <p className="mt-1 font-mono text-sm break-all" data-testid="new-api-token">
        {token}
      </p>
      <p className="mt-1 text-xs text-stone-600">
        Copy it now into the instrument or script that uses it. Washproof keeps only its SHA-256, so
        nobody can show it again; if it is lost, revoke it and create another.
      </p>
    </div>
  );
}

export function CreateApiTokenForm({ canWrite }: { canWrite: boolean }) {
  return (
    <ActionForm
      action={createApiTokenAction}
      className="max-w-xl space-y-4"
      aria-label="Create API token"
      showSuccess={false}
    >
      <NewToken />
      <Field
        name="name"
        label="Name"
        hint="What uses it, e.g. “Particle counter, lab 2”."
        maxLength={80}
      />
      <ChoiceGroup
        type="radio"
        name="scope"
        legend="Scope"
        defaultValues={["read"]}
        options={[
          { value: "read", label: `${SCOPE_LABELS.read}: read records` },
          {
            value: "read_write",
            label: `${SCOPE_LABELS.read_write}: also post test results${canWrite ? "" : " (your role does not write, so such a token is refused when it tries)"}`,
          },
        ]}
      />
      <SelectField
        name="expiresInDays"
        label="Works for"
        defaultValue={String(DEFAULT_TOKEN_DAYS)}
        options={TOKEN_LIFETIMES_DAYS.map((d) => ({ value: String(d), label: `${d} days` }))}
        hint="It stops working after that, and at once if your password is reset or your account is deactivated."
      />
      <SubmitButton>Create token</SubmitButton>
    </ActionForm>
  );
}

export function RevokeApiTokenForm({ tokenId, name }: { tokenId: string; name: string }) {
  return (
    <ActionForm action={revokeApiTokenAction} aria-label={`Revoke ${name}`} showSuccess={false}>
      <input type="hidden" name="tokenId" value={tokenId} />
      <SubmitButton
        variant="danger"
        className="px-2.5 py-1 text-xs"
        aria-label={`Revoke token ${name}`}
      >
        Revoke
      </SubmitButton>
    </ActionForm>
  );
}
