"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Field, TextareaField } from "@/components/ui/field";
import { PayloadField, useRowList } from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import {
  RecipeStagesEditor,
  stagesPayload,
  type StageDraft,
} from "@/components/recipes/recipe-stages-editor";
import type { FormState } from "@/lib/actions/result";

export interface NewRecipeFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  systemId: string;
  /** The washer's own stages in process order, offered as the recipe's starting stages. */
  stages: { name: string; kind: StageDraft["kind"]; mode: StageDraft["mode"] }[];
}

/** A new recipe for one cleaning system: its stages in process order and each stage's parameters. */
export function NewRecipeForm(props: NewRecipeFormProps) {
  const [code, setCode] = useState("");
  const [name, setName] = useState("");
  const [description, setDescription] = useState("");
  const [detergent, setDetergent] = useState("");
  const [notes, setNotes] = useState("");
  const stages = useRowList<StageDraft>(() => props.stages.map((s) => ({ ...s, parameters: [] })));
  const payload = {
    systemId: props.systemId,
    code,
    name,
    description,
    content: { detergent, notes, stages: stagesPayload(stages.values) },
  };

  return (
    <ActionForm action={props.action} className="space-y-6" aria-label="New recipe">
      <PayloadField value={payload} />
      <div className="grid gap-4 md:grid-cols-2">
        <Field
          label="Recipe code"
          errorKey="code"
          value={code}
          onValueChange={setCode}
          hint="Letters, digits and . _ / -, e.g. R-AW3-MN."
        />
        <Field label="Recipe name" errorKey="name" value={name} onValueChange={setName} />
        <Field
          label="Detergent"
          errorKey="content.detergent"
          value={detergent}
          onValueChange={setDetergent}
        />
        <Field
          label="Description"
          errorKey="description"
          value={description}
          onValueChange={setDescription}
        />
      </div>
      <TextareaField
        label="Version notes"
        errorKey="content.notes"
        value={notes}
        onValueChange={setNotes}
        rows={2}
      />
      <RecipeStagesEditor stages={stages} errorPrefix="content" />
      <SubmitButton pendingText="Creating…">Create draft recipe</SubmitButton>
    </ActionForm>
  );
}
