"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Field, SelectField, TextareaField } from "@/components/ui/field";
import { PayloadField, useRowList } from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import {
  RecipeStagesEditor,
  stageDraftsOf,
  stagesPayload,
  type StageDraft,
} from "@/components/recipes/recipe-stages-editor";
import type { FormState } from "@/lib/actions/result";
import {
  CHANGE_KIND_LABELS,
  CHANGE_KINDS_FOR_EFFECTIVE,
  OPENED_ELSEWHERE,
  type ChangeKind,
} from "@/lib/changes/workflow";
import type { RecipeSnapshot } from "@/lib/changes/diff";

export interface ProposalEditorProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  changeRequestId: string;
  /** Refreshed from the server after each save, so the next save is measured against it. */
  lockVersion: number;
  title: string;
  kind: ChangeKind;
  partFamilyId: string | null;
  families: { id: string; code: string; name: string }[];
  raisedTo: string | null;
  raiseReason: string | null;
  computed: string;
  recipe: RecipeSnapshot;
}

/** The proposed recipe version: stages, modes and parameters, with cautions kept in view while editing. */
export function ProposalEditor(props: ProposalEditorProps) {
  const [title, setTitle] = useState(props.title);
  const [kind, setKind] = useState<ChangeKind>(props.kind);
  const [partFamilyId, setPartFamilyId] = useState(props.partFamilyId ?? "");
  const [raiseTo, setRaiseTo] = useState(props.raisedTo ?? "");
  const [raiseReason, setRaiseReason] = useState(props.raiseReason ?? "");
  const [detergent, setDetergent] = useState(props.recipe.detergent ?? "");
  const [notes, setNotes] = useState(props.recipe.notes ?? "");
  const stages = useRowList<StageDraft>(() => stageDraftsOf(props.recipe.stages));

  const payload = {
    changeRequestId: props.changeRequestId,
    lockVersion: props.lockVersion,
    title,
    kind,
    partFamilyId,
    raiseTo,
    raiseReason,
    recipe: {
      detergent,
      notes,
      stages: stagesPayload(stages.values),
    },
  };
  return (
    <ActionForm action={props.action} className="space-y-6" aria-label="Proposed change">
      <PayloadField value={payload} />
      <div className="grid gap-4 md:grid-cols-2">
        <Field label="Title" errorKey="title" value={title} onValueChange={setTitle} />
        <SelectField
          label="Kind of change"
          errorKey="kind"
          value={kind}
          onValueChange={(v) => setKind(v as ChangeKind)}
          // A kind opened from its own record keeps it; a change never becomes one.
          options={(OPENED_ELSEWHERE.includes(props.kind)
            ? [props.kind]
            : CHANGE_KINDS_FOR_EFFECTIVE
          ).map((k) => ({ value: k, label: CHANGE_KIND_LABELS[k] }))}
        />
        {(kind === "new_part_family" || kind === "initial_validation") && (
          <SelectField
            label={
              kind === "initial_validation"
                ? "Part family validated for"
                : "Part family added to the recipe"
            }
            errorKey="partFamilyId"
            value={partFamilyId}
            onValueChange={setPartFamilyId}
            placeholder="Choose…"
            options={props.families.map((f) => ({ value: f.id, label: `${f.code} ${f.name}` }))}
          />
        )}
        <Field
          label="Detergent"
          errorKey="recipe.detergent"
          value={detergent}
          onValueChange={setDetergent}
        />
      </div>
      <TextareaField
        label="Version notes"
        errorKey="recipe.notes"
        value={notes}
        onValueChange={setNotes}
        rows={2}
      />

      <RecipeStagesEditor stages={stages} errorPrefix="recipe" />

      <div className="grid gap-4 md:grid-cols-[14rem_1fr]">
        <SelectField
          label="Raise the classification"
          errorKey="raiseTo"
          value={raiseTo}
          onValueChange={setRaiseTo}
          options={[
            { value: "", label: `Keep the computed class (${props.computed})` },
            { value: "minor", label: "Raise to minor" },
            { value: "major", label: "Raise to major" },
          ]}
        />
        <Field
          label="Reason for raising"
          errorKey="raiseReason"
          value={raiseReason}
          onValueChange={setRaiseReason}
        />
      </div>
      <SubmitButton pendingText="Saving…">Save proposal</SubmitButton>
    </ActionForm>
  );
}
