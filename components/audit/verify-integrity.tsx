"use client";

import { ShieldCheck } from "lucide-react";
import { verifyIntegrityAction } from "@/app/(app)/trace/audit/actions";
import { ActionForm } from "@/components/ui/action-form";
import { SubmitButton } from "@/components/ui/submit-button";

export function VerifyIntegrity() {
  return (
    <ActionForm action={verifyIntegrityAction} className="flex max-w-md flex-col items-end" aria-label="Verify integrity">
      <SubmitButton variant="secondary" pendingText="Verifying…">
        <ShieldCheck className="h-4 w-4" aria-hidden="true" /> Verify integrity
      </SubmitButton>
    </ActionForm>
  );
}
