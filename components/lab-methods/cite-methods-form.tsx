"use client";

import { ActionForm } from "@/components/ui/action-form";
import { SelectField } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { LabMethodKind } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { LAB_METHOD_KIND_LABELS } from "@/lib/schemas/lab-method";

/** Which approved method version of each kind the run used; part of what the technician signs. */
export function CiteMethodsForm(props: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  runId: string;
  kinds: readonly LabMethodKind[];
  options: Record<LabMethodKind, { value: string; label: string }[]>;
  cited: Partial<Record<LabMethodKind, string>>;
}) {
  return (
    <ActionForm
      action={props.action}
      aria-label="Methods used"
      className="flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-4"
    >
      <input type="hidden" name="runId" value={props.runId} />
      {props.kinds.map((kind) => (
        <SelectField
          key={kind}
          name={kind}
          label={LAB_METHOD_KIND_LABELS[kind]}
          placeholder="None cited"
          defaultValue={props.cited[kind] ?? ""}
          options={props.options[kind]}
        />
      ))}
      <SubmitButton variant="secondary">Save methods used</SubmitButton>
    </ActionForm>
  );
}
