"use client";

import { PenLine } from "lucide-react";
import { useRef, type ReactNode } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { SignatureMeaning, SignedRecordType } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { MEANING_LABELS, meaningStatement } from "@/lib/signatures/rules";

export interface SignatureDialogProps {
  /** Server action that verifies the password and signs; receives the form's fields. */
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  meaning: SignatureMeaning;
  /** The kind of record signed: each has its own wording for a meaning. */
  recordType: SignedRecordType;
  signerName: string;
  /** What is being signed, e.g. "PQ-AW3-004 version 2". */
  recordLabel: string;
  contentHash: string;
  /** Hidden fields the action needs (record id, lock version …). */
  hidden?: Record<string, string>;
  /** Extra fields, such as a required comment. */
  children?: ReactNode;
  buttonLabel?: string;
  /** Send the meaning as a field: only for an action that signs more than one meaning. */
  postsMeaning?: boolean;
}

/**
 * The signing ceremony: states the meaning, the signer's printed name and the
 * hash of exactly the version signed, and asks for the password every time.
 */
export function SignatureDialog({
  action,
  meaning,
  recordType,
  signerName,
  recordLabel,
  contentHash,
  hidden = {},
  children,
  buttonLabel,
  postsMeaning = false,
}: SignatureDialogProps) {
  const dialog = useRef<HTMLDialogElement>(null);
  const label = buttonLabel ?? `Sign as ${MEANING_LABELS[meaning].toLowerCase()}`;
  return (
    <>
      <Button onClick={() => dialog.current?.showModal()}>
        <PenLine className="h-4 w-4" aria-hidden="true" />
        {label}
      </Button>
      <dialog
        ref={dialog}
        aria-labelledby={`sign-${meaning}-title`}
        className="m-auto w-full max-w-lg rounded-xl p-0 backdrop:bg-stone-900/40"
      >
        <div className="p-6">
          <h2 id={`sign-${meaning}-title`} className="text-lg font-semibold text-stone-900">
            {label}: {recordLabel}
          </h2>
          <p className="mt-3 rounded-md bg-stone-50 p-3 text-sm text-stone-800">
            {meaningStatement(recordType, meaning)}
          </p>
          <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1 text-sm">
            <dt className="text-stone-500">Printed name</dt>
            <dd>{signerName}</dd>
            <dt className="text-stone-500">Meaning</dt>
            <dd>{MEANING_LABELS[meaning]}</dd>
            <dt className="text-stone-500">Content hash</dt>
            <dd className="font-mono text-xs break-all">{contentHash}</dd>
          </dl>
          <ActionForm action={action} className="mt-4 space-y-4" aria-label={label}>
            {Object.entries(hidden).map(([name, value]) => (
              <input key={name} type="hidden" name={name} value={value} />
            ))}
            {postsMeaning && <input type="hidden" name="meaning" value={meaning} />}
            <input type="hidden" name="contentHash" value={contentHash} />
            {children}
            <Field
              name="password"
              label="Your password"
              type="password"
              autoComplete="current-password"
              hint="A wrong password counts toward locking your account; the refusal says how many attempts are left."
            />
            <div className="flex justify-end gap-2">
              <Button variant="secondary" onClick={() => dialog.current?.close()}>
                Cancel
              </Button>
              <SubmitButton pendingText="Signing…">Sign</SubmitButton>
            </div>
          </ActionForm>
        </div>
      </dialog>
    </>
  );
}
