"use client";

import { Plus } from "lucide-react";
import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { FieldError } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { SubmitButton } from "@/components/ui/submit-button";
import { STAGE_KINDS, STAGE_MODES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";

interface StageDraft {
  key: string;
  id: string | null;
  name: string;
  kind: string;
  capabilities: string[];
  tankVolumeL: string;
}

export interface SystemEditorProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  system: { id: string; name: string; description: string | null; stages: { id: string; name: string; kind: string; capabilities: string[]; tankVolumeL: number | null }[] };
}

const input = "block w-full rounded-md border border-stone-300 bg-white px-2.5 py-1.5 text-sm aria-invalid:border-red-700";

/** The administrator's editor for a washer: name, description and its stages with what each can run. */
export function SystemEditor({ action, system }: SystemEditorProps) {
  const [name, setName] = useState(system.name);
  const [description, setDescription] = useState(system.description ?? "");
  const [stages, setStages] = useState<StageDraft[]>(() =>
    system.stages.map((s) => ({ key: s.id, id: s.id, name: s.name, kind: s.kind, capabilities: s.capabilities, tankVolumeL: s.tankVolumeL === null ? "" : String(s.tankVolumeL) })),
  );
  const set = (i: number, patch: Partial<StageDraft>) => setStages((all) => all.map((s, j) => (j === i ? { ...s, ...patch } : s)));
  const payload = { systemId: system.id, name, description, stages: stages.map(({ key: _k, ...s }) => s) };
  return (
    <ActionForm action={action} className="space-y-4" aria-label="Edit cleaning system">
      <input type="hidden" name="payload" value={JSON.stringify(payload)} />
      <label className="block text-sm font-medium">
        System name
        <input value={name} onChange={(e) => setName(e.target.value)} className={`mt-1 ${input}`} />
        <FieldError name="name" />
      </label>
      <label className="block text-sm font-medium">
        Description
        <input value={description} onChange={(e) => setDescription(e.target.value)} className={`mt-1 ${input}`} />
      </label>
      {stages.map((s, i) => (
        <fieldset key={s.key} className="rounded-md border border-stone-200 p-3">
          <legend className="px-1 text-sm font-semibold">Stage {i + 1}</legend>
          <div className="grid gap-3 md:grid-cols-3">
            <label className="text-sm font-medium">
              Name of stage {i + 1}
              <input value={s.name} onChange={(e) => set(i, { name: e.target.value })} className={`mt-1 ${input}`} />
              <FieldError name={`stages.${i}.name`} />
            </label>
            <label className="text-sm font-medium">
              Kind of stage {i + 1}
              <select value={s.kind} onChange={(e) => set(i, { kind: e.target.value })} className={`mt-1 ${input}`}>
                {STAGE_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {humanize(k)}
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm font-medium">
              Tank volume of stage {i + 1} (L)
              <input value={s.tankVolumeL} onChange={(e) => set(i, { tankVolumeL: e.target.value })} inputMode="decimal" className={`mt-1 ${input}`} />
              <FieldError name={`stages.${i}.tankVolumeL`} />
            </label>
          </div>
          <fieldset className="mt-2">
            <legend className="text-sm font-medium">Stage {i + 1} can run</legend>
            <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
              {STAGE_MODES.map((m) => (
                <label key={m} className="flex items-center gap-1.5 text-sm">
                  <input
                    type="checkbox"
                    checked={s.capabilities.includes(m)}
                    onChange={(e) => set(i, { capabilities: e.target.checked ? [...s.capabilities, m] : s.capabilities.filter((c) => c !== m) })}
                  />
                  {STAGE_MODE_LABELS[m]}
                </label>
              ))}
            </div>
            <FieldError name={`stages.${i}.capabilities`} />
          </fieldset>
        </fieldset>
      ))}
      <div className="flex gap-2">
        <Button variant="secondary" onClick={() => setStages((all) => [...all, { key: `new-${all.length}`, id: null, name: "", kind: "rinse", capabilities: [], tankVolumeL: "" }])}>
          <Plus className="h-4 w-4" aria-hidden="true" /> Add stage
        </Button>
        <SubmitButton>Save system</SubmitButton>
      </div>
    </ActionForm>
  );
}

