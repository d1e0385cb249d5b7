"use client";

import { Trash2 } from "lucide-react";
import { ActionForm } from "@/components/ui/action-form";
import { Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

/** Removing a sample changes the result: it opens a reason field first, and the reason goes to the audit trail. */
export function RemoveSampleButton({
  action,
  runId,
  sampleId,
  label,
}: {
  action: Action;
  runId: string;
  sampleId: string;
  label: string;
}) {
  return (
    <details className="group text-sm">
      <summary
        className="flex cursor-pointer list-none items-center rounded p-1.5 text-stone-700 hover:bg-stone-100"
        aria-label={`Remove sample ${label}`}
      >
        <Trash2 className="h-4 w-4" aria-hidden="true" />
      </summary>
      <ActionForm
        action={action}
        showSuccess={false}
        className="mt-2 w-64 space-y-2"
        aria-label={`Remove sample ${label}`}
      >
        <input type="hidden" name="runId" value={runId} />
        <input type="hidden" name="sampleId" value={sampleId} />
        <Field
          name="reason"
          label={`Reason for removing ${label}`}
          hint="Kept in the audit trail with the removed values."
        />
        <SubmitButton variant="secondary" pendingText="Removing…">
          Remove sample
        </SubmitButton>
      </ActionForm>
    </details>
  );
}

/** Detaches a file attached in error, with its reason; the stored file stays. */
export function DetachFileForm({
  action,
  runId,
  fileId,
  name,
}: {
  action: Action;
  runId: string;
  fileId: string;
  name: string;
}) {
  return (
    <details className="text-xs">
      <summary className="cursor-pointer text-brand-800 hover:underline">Detach</summary>
      <ActionForm
        action={action}
        showSuccess={false}
        className="mt-2 space-y-2"
        aria-label={`Detach ${name}`}
      >
        <input type="hidden" name="runId" value={runId} />
        <input type="hidden" name="fileId" value={fileId} />
        <Field name="reason" label={`Reason for detaching ${name}`} />
        <SubmitButton variant="secondary" pendingText="Detaching…">
          Detach file
        </SubmitButton>
      </ActionForm>
    </details>
  );
}

/** A correction of a signed run: a new revision with its reason; the old revision stays as it was. */
export function ReviseForm({ action, runId }: { action: Action; runId: string }) {
  return (
    <ActionForm
      action={action}
      className="space-y-3 rounded-lg border border-stone-200 bg-white p-4"
      aria-label="Correct this run"
    >
      <input type="hidden" name="runId" value={runId} />
      <Field
        name="reason"
        label="Reason for the correction"
        hint="A new revision opens with the same data and files; this revision stays visible with its signatures."
      />
      <SubmitButton variant="secondary">Make a new revision</SubmitButton>
    </ActionForm>
  );
}
