"use client";

import { ActionForm } from "@/components/ui/action-form";
import { TextareaField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

/** Retiring keeps the washer's records; the reason goes into the audit trail. */
export function RetireSystemForm({
  action,
  systemId,
  code,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  systemId: string;
  code: string;
}) {
  return (
    <ActionForm action={action} className="space-y-3" aria-label={`Retire ${code}`}>
      <input type="hidden" name="systemId" value={systemId} />
      <TextareaField
        name="reason"
        label="Why it is retired"
        hint="Kept in the audit trail, e.g. scrapped, sold, replaced by another washer."
        rows={2}
      />
      <SubmitButton variant="danger">Retire system</SubmitButton>
    </ActionForm>
  );
}
