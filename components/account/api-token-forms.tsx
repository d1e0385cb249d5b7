"use client";

import { ActionForm, useFormResult } from "@/components/ui/action-form";
import { Field, FieldError } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import { createApiTokenAction, revokeApiTokenAction } from "@/app/(app)/account/tokens/actions";
import { DEFAULT_TOKEN_DAYS, SCOPE_LABELS, TOKEN_LIFETIMES_DAYS } from "@/lib/schemas/api-token";

/** Shows a new token once: only its hash is kept, so it cannot be shown again. */
function NewToken() {
  const { state } = useFormResult();
  const token = state && state.ok ? (state as { token?: string }).token : undefined;
  if (!token) return null;
  return (
    <div role="status" aria-label="New API token" className="rounded-md border border-brand-300 bg-brand-50 p-4 text-sm">
      <p className="font-medium text-brand-900">Your new token (shown once)</p>
      <p className="mt-1 font-mono text-sm break-all" data-testid="new-api-token">
        {token}
      </p>
      <p className="mt-1 text-xs text-stone-600">Copy it now into the instrument or script that uses it. Washproof keeps only its SHA-256, so nobody can show it again; if it is lost, revoke it and create another.</p>
    </div>
  );
}

export function CreateApiTokenForm({ canWrite }: { canWrite: boolean }) {
  return (
    <ActionForm action={createApiTokenAction} className="max-w-xl space-y-4" aria-label="Create API token" showSuccess={false}>
      <NewToken />
      <Field name="name" label="Name" hint="What uses it, e.g. “Particle counter, lab 2”." maxLength={80} />
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium text-stone-800">Scope</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="scope" value="read" defaultChecked /> {SCOPE_LABELS.read}: read records
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="scope" value="read_write" /> {SCOPE_LABELS.read_write}: also post test results{canWrite ? "" : " (your role does not write, so such a token is refused when it tries)"}
        </label>
        <FieldError name="scope" />
      </fieldset>
      <div className="space-y-1">
        <label htmlFor="token-lifetime" className="block text-sm font-medium text-stone-800">
          Works for
        </label>
        <select id="token-lifetime" name="expiresInDays" defaultValue={String(DEFAULT_TOKEN_DAYS)} aria-describedby="token-lifetime-hint" className="rounded-md border border-stone-300 px-2 py-1.5 text-sm">
          {TOKEN_LIFETIMES_DAYS.map((d) => (
            <option key={d} value={d}>
              {d} days
            </option>
          ))}
        </select>
        <p id="token-lifetime-hint" className="text-xs text-stone-600">
          It stops working after that, and at once if your password is reset or your account is deactivated.
        </p>
        <FieldError name="expiresInDays" />
      </div>
      <SubmitButton>Create token</SubmitButton>
    </ActionForm>
  );
}

export function RevokeApiTokenForm({ tokenId, name }: { tokenId: string; name: string }) {
  return (
    <ActionForm action={revokeApiTokenAction} aria-label={`Revoke ${name}`} showSuccess={false}>
      <input type="hidden" name="tokenId" value={tokenId} />
      <SubmitButton variant="danger" className="px-2.5 py-1 text-xs" aria-label={`Revoke token ${name}`}>
        Revoke
      </SubmitButton>
    </ActionForm>
  );
}
