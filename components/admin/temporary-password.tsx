"use client";

import { useFormResult } from "@/components/ui/action-form";

/** Shows a freshly issued temporary password once; it is never stored in clear or shown again. */
export function TemporaryPassword() {
  const { state } = useFormResult();
  const password =
    state && state.ok ? (state as { temporaryPassword?: string }).temporaryPassword : undefined;
  if (!password) return null;
  return (
    <div role="status" className="rounded-md border border-brand-300 bg-brand-50 p-4 text-sm">
      <p className="font-medium text-brand-900">Temporary password (shown once)</p>
      <p className="mt-1 font-mono text-base tracking-wide" data-testid="temporary-password">
        {password}
      </p>
      <p className="mt-1 text-xs text-stone-600">
        Hand it over in person or by phone. The user must choose a new password at first sign-in.
      </p>
    </div>
  );
}
