"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { CheckboxField, Field, FieldError, NumberField, SelectField } from "@/components/ui/field";
import { AddRowButton, PayloadField, useRowList } from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import { STAGE_KINDS, STAGE_MODES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";

interface StageDraft {
  id: string | null;
  name: string;
  kind: string;
  capabilities: string[];
  tankVolumeL: string;
}

export interface SystemEditorProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  system: {
    id: string;
    name: string;
    description: string | null;
    stages: {
      id: string;
      name: string;
      kind: string;
      capabilities: string[];
      tankVolumeL: number | null;
    }[];
  };
}

const KIND_OPTIONS = STAGE_KINDS.map((k) => ({ value: k, label: humanize(k) }));

/** The administrator's editor for a washer: name, description and its stages with what each can run. */
export function SystemEditor({ action, system }: SystemEditorProps) {
  const [name, setName] = useState(system.name);
  const [description, setDescription] = useState(system.description ?? "");
  const stages = useRowList<StageDraft>(() =>
    system.stages.map((s) => ({
      id: s.id,
      name: s.name,
      kind: s.kind,
      capabilities: s.capabilities,
      tankVolumeL: s.tankVolumeL === null ? "" : String(s.tankVolumeL),
    })),
  );
  return (
    <ActionForm action={action} className="space-y-4" aria-label="Edit cleaning system">
      <PayloadField value={{ systemId: system.id, name, description, stages: stages.values }} />
      <Field label="System name" errorKey="name" value={name} onValueChange={setName} />
      <Field
        label="Description"
        errorKey="description"
        value={description}
        onValueChange={setDescription}
      />
      {stages.rows.map(({ key, value: s }, i) => (
        <fieldset key={key} className="rounded-md border border-stone-200 p-3">
          <legend className="px-1 text-sm font-semibold">Stage {i + 1}</legend>
          <div className="grid gap-3 md:grid-cols-3">
            <Field
              label={`Name of stage ${i + 1}`}
              errorKey={`stages.${i}.name`}
              value={s.name}
              onValueChange={(v) => stages.update(i, { name: v })}
            />
            <SelectField
              label={`Kind of stage ${i + 1}`}
              errorKey={`stages.${i}.kind`}
              value={s.kind}
              onValueChange={(v) => stages.update(i, { kind: v })}
              options={KIND_OPTIONS}
            />
            <NumberField
              label={`Tank volume of stage ${i + 1} (L)`}
              errorKey={`stages.${i}.tankVolumeL`}
              value={s.tankVolumeL}
              onValueChange={(v) => stages.update(i, { tankVolumeL: v })}
            />
          </div>
          <fieldset className="mt-2">
            <legend className="text-sm font-medium">Stage {i + 1} can run</legend>
            <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
              {STAGE_MODES.map((m) => (
                <CheckboxField
                  key={m}
                  label={STAGE_MODE_LABELS[m]}
                  checked={s.capabilities.includes(m)}
                  onCheckedChange={(on) =>
                    stages.update(i, (st) => ({
                      ...st,
                      capabilities: on
                        ? [...st.capabilities, m]
                        : st.capabilities.filter((c) => c !== m),
                    }))
                  }
                />
              ))}
            </div>
            <FieldError name={`stages.${i}.capabilities`} />
          </fieldset>
        </fieldset>
      ))}
      <div className="flex gap-2">
        <AddRowButton
          onAdd={() =>
            stages.add({ id: null, name: "", kind: "rinse", capabilities: [], tankVolumeL: "" })
          }
        >
          Add stage
        </AddRowButton>
        <SubmitButton>Save system</SubmitButton>
      </div>
    </ActionForm>
  );
}
