"use client";

import { Stamp, ShieldCheck } from "lucide-react";
import { verifyIntegrityAction, writeCheckpointAction } from "@/app/(app)/trace/audit/actions";
import { ActionForm, useFormResult } from "@/components/ui/action-form";
import { SubmitButton } from "@/components/ui/submit-button";
import type { IntegrityState } from "@/lib/server/audit/integrity-summary";

/** Every problem the check found, listed under its summary so one flaw never hides another. */
function Findings() {
  const { state } = useFormResult();
  const findings = (state as IntegrityState)?.findings ?? [];
  if (findings.length === 0) return null;
  return (
    <ul
      aria-label="Integrity problems"
      className="mb-4 max-h-80 list-disc space-y-1 overflow-y-auto rounded-md border border-red-300 bg-red-50 py-2 pl-8 pr-3 text-sm text-red-900"
    >
      {findings.map((f, i) => (
        <li key={i}>{f}</li>
      ))}
    </ul>
  );
}

export function VerifyIntegrity() {
  return (
    <div className="flex max-w-xl flex-col items-end gap-2">
      <ActionForm
        action={verifyIntegrityAction}
        className="flex w-full flex-col items-end"
        aria-label="Verify integrity"
      >
        <Findings />
        <SubmitButton variant="secondary" pendingText="Verifying…">
          <ShieldCheck className="h-4 w-4" aria-hidden="true" /> Verify integrity
        </SubmitButton>
      </ActionForm>
      <ActionForm
        action={writeCheckpointAction}
        className="flex w-full flex-col items-end"
        aria-label="Sign a checkpoint"
      >
        <SubmitButton variant="secondary" pendingText="Signing…">
          <Stamp className="h-4 w-4" aria-hidden="true" /> Sign a checkpoint now
        </SubmitButton>
      </ActionForm>
    </div>
  );
}
