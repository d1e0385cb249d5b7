"use client";

import { ActionForm } from "@/components/ui/action-form";
import { DateField, Field, SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";
import { meaningStatement } from "@/lib/signatures/rules";

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;
type Option = { value: string; label: string };

/** The trainer's practical sign-off: who, on which method, when; signed with the trainer's password. */
export function SignOffForm(props: {
  action: Action;
  people: Option[];
  methods: Option[];
  today: string;
  signerName: string;
}) {
  return (
    <ActionForm
      action={props.action}
      aria-label="Sign off practical training"
      className="max-w-xl space-y-3"
    >
      <SelectField
        name="userId"
        label="Person trained"
        placeholder="Choose…"
        options={props.people}
      />
      <SelectField
        name="methodCode"
        label="Lab method"
        placeholder="Choose…"
        options={props.methods}
      />
      <DateField name="trainedOn" label="Trained on" defaultValue={props.today} />
      <SignWithPassword
        signerName={props.signerName}
        statement={meaningStatement("training_record", "verified")}
        button="Sign off training"
      />
    </ActionForm>
  );
}

/** The person's own read-and-understood acknowledgement of a procedure version in force. */
export function AcknowledgeForm(props: {
  action: Action;
  procedures: Option[];
  signerName: string;
}) {
  return (
    <ActionForm
      action={props.action}
      aria-label="Acknowledge a procedure"
      className="max-w-xl space-y-3"
    >
      <SelectField
        name="documentVersionId"
        label="Procedure"
        placeholder="Choose…"
        options={props.procedures}
      />
      <SignWithPassword
        signerName={props.signerName}
        statement={meaningStatement("training_record", "reviewed")}
        button="Sign acknowledgement"
      />
    </ActionForm>
  );
}

/** What the signer affirms, in their name, then their password: each signing asks for it. */
function SignWithPassword(props: { signerName: string; statement: string; button: string }) {
  return (
    <>
      <p className="rounded-md bg-stone-50 p-3 text-sm text-stone-700">
        {props.signerName}: “{props.statement}”
      </p>
      <Field
        name="password"
        type="password"
        label="Your password"
        autoComplete="current-password"
      />
      <SubmitButton>{props.button}</SubmitButton>
    </>
  );
}
