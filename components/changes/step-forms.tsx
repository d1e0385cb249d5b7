"use client";

import { useRef } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

/** A step that needs no signature: one button, with the result shown beside it. */
export function StepButton({
  action,
  changeRequestId,
  label,
  variant = "primary",
}: {
  action: Action;
  changeRequestId: string;
  label: string;
  variant?: "primary" | "secondary";
}) {
  return (
    <ActionForm action={action} aria-label={label}>
      <input type="hidden" name="changeRequestId" value={changeRequestId} />
      <SubmitButton variant={variant}>{label}</SubmitButton>
    </ActionForm>
  );
}

/** Reject, withdraw or reopen: asks for the reason that goes into the audit trail. */
export function ReasonStep({
  action,
  changeRequestId,
  label,
  variant = "danger",
}: {
  action: Action;
  changeRequestId: string;
  label: string;
  variant?: "danger" | "secondary";
}) {
  const dialog = useRef<HTMLDialogElement>(null);
  return (
    <>
      <Button variant={variant} onClick={() => dialog.current?.showModal()}>
        {label}
      </Button>
      <dialog
        ref={dialog}
        aria-label={label}
        className="m-auto w-full max-w-lg rounded-xl p-0 backdrop:bg-stone-900/40"
      >
        <ActionForm action={action} className="space-y-4 p-6" aria-label={`${label} form`}>
          <h2 className="text-lg font-semibold">{label}</h2>
          <input type="hidden" name="changeRequestId" value={changeRequestId} />
          <Field name="reason" label="Reason" />
          <div className="flex justify-end gap-2">
            <Button variant="secondary" onClick={() => dialog.current?.close()}>
              Cancel
            </Button>
            <SubmitButton variant={variant === "danger" ? "danger" : "primary"}>
              {label}
            </SubmitButton>
          </div>
        </ActionForm>
      </dialog>
    </>
  );
}

/** Offer a test run as the evidence for one required test. */
export function LinkEvidenceForm({
  action,
  changeRequestId,
  requirementId,
  label,
  runs,
}: {
  action: Action;
  changeRequestId: string;
  requirementId: string;
  label: string;
  runs: { id: string; number: string; outcome: string | null; status: string }[];
}) {
  return (
    <ActionForm
      action={action}
      className="mt-2 flex flex-wrap items-end gap-2"
      aria-label={`Link evidence for ${label}`}
    >
      <input type="hidden" name="changeRequestId" value={changeRequestId} />
      <input type="hidden" name="requirementId" value={requirementId} />
      <SelectField
        name="testRunId"
        label={`Test run for ${label}`}
        placeholder="Choose…"
        defaultValue=""
        dense
        options={runs.map((r) => ({
          value: r.id,
          label: `${r.number} — ${r.status}, outcome ${r.outcome ?? "not computed"}`,
        }))}
      />
      <SubmitButton variant="secondary">Link</SubmitButton>
    </ActionForm>
  );
}
