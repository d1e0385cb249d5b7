"use client";

import { Plus, Trash2 } from "lucide-react";
import { useId, useState, type ReactNode } from "react";
import { ActionForm, useFormResult } from "@/components/ui/action-form";
import { FieldError } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Caution } from "@/components/ui/caution";
import { SubmitButton } from "@/components/ui/submit-button";
import { CHANGE_KINDS, PARAMETER_KINDS, STAGE_KINDS, STAGE_MODES, type ParameterKind } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";
import { CHANGE_KIND_LABELS, type ChangeKind } from "@/lib/changes/workflow";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import { hazardsOfStages } from "@/lib/recipes/hazards";
import { PARAMETER_KIND_LABELS, UNITS_BY_KIND } from "@/lib/recipes/units";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

type Text = string;
interface ParamDraft {
  uid: string;
  key: Text;
  name: Text;
  kind: ParameterKind;
  setpoint: Text;
  unit: Text;
  validatedLow: Text;
  validatedHigh: Text;
  critical: boolean;
  isNew: boolean;
}
interface StageDraft {
  uid: string;
  name: Text;
  kind: (typeof STAGE_KINDS)[number];
  mode: (typeof STAGE_MODES)[number] | "";
  parameters: ParamDraft[];
}

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

let counter = 0;
const uid = () => `u${++counter}`;
const num = (v: number | null) => (v === null ? "" : String(v));

/** The proposed recipe version: stages, modes and parameters, with cautions kept in view while editing. */
export function ProposalEditor(props: ProposalEditorProps) {
  const [title, setTitle] = useState(props.title);
  const [kind, setKind] = useState<ChangeKind>(props.kind);
  const [partFamilyId, setPartFamilyId] = useState(props.partFamilyId ?? "");
  const [raiseTo, setRaiseTo] = useState(props.raisedTo ?? "");
  const [raiseReason, setRaiseReason] = useState(props.raiseReason ?? "");
  const [detergent, setDetergent] = useState(props.recipe.detergent ?? "");
  const [notes, setNotes] = useState(props.recipe.notes ?? "");
  const [stages, setStages] = useState<StageDraft[]>(() =>
    props.recipe.stages.map((s) => ({
      uid: uid(),
      name: s.name,
      kind: s.kind as StageDraft["kind"],
      mode: (s.mode ?? "") as StageDraft["mode"],
      parameters: s.parameters.map((p) => ({ uid: uid(), key: p.key, name: p.name, kind: p.kind, setpoint: num(p.setpoint), unit: p.unit, validatedLow: num(p.validatedLow), validatedHigh: num(p.validatedHigh), critical: p.critical, isNew: false })),
    })),
  );

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
      stages: stages.map((s) => ({ name: s.name, kind: s.kind, mode: s.mode || null, parameters: s.parameters.map(({ uid: _u, isNew: _n, ...p }) => p) })),
    },
  };
  const hazards = hazardsOfStages(
    stages.map((s) => ({
      mode: s.mode || null,
      parameters: s.parameters.map((p) => ({ kind: p.kind, unit: p.unit, setpoint: Number(p.setpoint) || 0, validatedHigh: p.validatedHigh === "" ? null : Number(p.validatedHigh) })),
    })),
  );

  const updateStage = (i: number, patch: Partial<StageDraft>) => setStages((all) => all.map((s, j) => (j === i ? { ...s, ...patch } : s)));
  const updateParam = (i: number, k: number, patch: Partial<ParamDraft>) =>
    setStages((all) => all.map((s, j) => (j === i ? { ...s, parameters: s.parameters.map((p, m) => (m === k ? { ...p, ...patch } : p)) } : s)));

  return (
    <ActionForm action={props.action} className="space-y-6" aria-label="Proposed change">
      <input type="hidden" name="payload" value={JSON.stringify(payload)} />
      <div className="grid gap-4 md:grid-cols-2">
        <TextInput label="Title" path="title" value={title} onChange={setTitle} />
        <SelectInput label="Kind of change" path="kind" value={kind} onChange={(v) => setKind(v as ChangeKind)} options={CHANGE_KINDS.map((k) => [k, CHANGE_KIND_LABELS[k]])} />
        {kind === "new_part_family" && (
          <SelectInput
            label="Part family added to the recipe"
            path="partFamilyId"
            value={partFamilyId}
            onChange={setPartFamilyId}
            options={[["", "Choose…"], ...props.families.map((f): [string, string] => [f.id, `${f.code} ${f.name}`])]}
          />
        )}
        <TextInput label="Detergent" path="recipe.detergent" value={detergent} onChange={setDetergent} />
      </div>
      <TextArea label="Version notes" path="recipe.notes" value={notes} onChange={setNotes} rows={2} />

      {hazards.length > 0 && (
        <div className="space-y-2">
          {hazards.map((h) => (
            <Caution key={h.kind} title={h.title}>
              {h.text}
            </Caution>
          ))}
        </div>
      )}

      {PARAMETER_KINDS.map((k) => (
        <datalist key={k} id={`units-${k}`}>
          {UNITS_BY_KIND[k].map((u) => (
            <option key={u} value={u} />
          ))}
        </datalist>
      ))}
      {stages.map((stage, i) => (
        <fieldset key={stage.uid} className="rounded-lg border border-stone-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold text-stone-800">
            Stage {i + 1}: {stage.name || "unnamed"}
          </legend>
          <div className="grid gap-3 md:grid-cols-[1fr_12rem_12rem_auto]">
            <TextInput label={`Name of stage ${i + 1}`} path={`recipe.stages.${i}.name`} value={stage.name} onChange={(v) => updateStage(i, { name: v })} />
            <SelectInput label={`Kind of stage ${i + 1}`} path={`recipe.stages.${i}.kind`} value={stage.kind} onChange={(v) => updateStage(i, { kind: v as StageDraft["kind"] })} options={STAGE_KINDS.map((k) => [k, humanize(k)])} />
            <SelectInput
              label={`Mode of stage ${i + 1}`}
              path={`recipe.stages.${i}.mode`}
              value={stage.mode}
              onChange={(v) => updateStage(i, { mode: v as StageDraft["mode"] })}
              options={[["", "None"], ...STAGE_MODES.map((m): [string, string] => [m, STAGE_MODE_LABELS[m]])]}
            />
            <div className="flex items-end">
              <Button variant="ghost" onClick={() => setStages((all) => all.filter((_, j) => j !== i))} aria-label={`Remove stage ${i + 1}`}>
                <Trash2 className="h-4 w-4" aria-hidden="true" /> Remove stage
              </Button>
            </div>
          </div>
          <div className="mt-3 overflow-x-auto">
            <Table density="compact" caption={<>Parameters of stage {i + 1}</>}>
              <THead>
                <Th>Parameter</Th>
                <Th>Kind</Th>
                <Th>Setpoint</Th>
                <Th>Unit</Th>
                <Th>Validated low</Th>
                <Th>Validated high</Th>
                <Th>Critical</Th>
                <Th>
                  <span className="sr-only">Remove</span>
                </Th>
              </THead>
              <TBody className="align-top">
                {stage.parameters.map((p, k) => {
                  const path = `recipe.stages.${i}.parameters.${k}`;
                  const label = p.name || `parameter ${k + 1} of stage ${i + 1}`;
                  return (
                    <tr key={p.uid}>
                      <Td>
                        <TextInput cell label={`Name of ${label}`} path={`${path}.name`} value={p.name} onChange={(v) => updateParam(i, k, { name: v })} />
                        {p.isNew ? (
                          <TextInput cell label={`Key of ${label}`} path={`${path}.key`} value={p.key} onChange={(v) => updateParam(i, k, { key: v })} placeholder="stage.parameter" />
                        ) : (
                          <p className="mt-0.5 font-mono text-xs text-stone-500">{p.key}</p>
                        )}
                      </Td>
                      <Td>
                        <SelectInput cell
                          label={`Kind of ${label}`}
                          path={`${path}.kind`}
                          value={p.kind}
                          onChange={(v) => updateParam(i, k, { kind: v as ParameterKind, unit: UNITS_BY_KIND[v as ParameterKind][0] ?? p.unit })}
                          options={PARAMETER_KINDS.map((x) => [x, PARAMETER_KIND_LABELS[x]])}
                        />
                      </Td>
                      <Td>
                        <TextInput cell label={`Setpoint of ${label}`} path={`${path}.setpoint`} value={p.setpoint} onChange={(v) => updateParam(i, k, { setpoint: v })} inputMode="decimal" narrow />
                      </Td>
                      <Td>
                        <TextInput cell label={`Unit of ${label}`} path={`${path}.unit`} value={p.unit} onChange={(v) => updateParam(i, k, { unit: v })} list={`units-${p.kind}`} narrow />
                      </Td>
                      <Td>
                        <TextInput cell label={`Validated low of ${label}`} path={`${path}.validatedLow`} value={p.validatedLow} onChange={(v) => updateParam(i, k, { validatedLow: v })} inputMode="decimal" narrow />
                      </Td>
                      <Td>
                        <TextInput cell label={`Validated high of ${label}`} path={`${path}.validatedHigh`} value={p.validatedHigh} onChange={(v) => updateParam(i, k, { validatedHigh: v })} inputMode="decimal" narrow />
                      </Td>
                      <Td className="pt-2">
                        <input type="checkbox" aria-label={`Critical: ${label}`} checked={p.critical} onChange={(e) => updateParam(i, k, { critical: e.target.checked })} />
                      </Td>
                      <Td>
                        <Button variant="ghost" aria-label={`Remove ${label}`} onClick={() => updateStage(i, { parameters: stage.parameters.filter((_, m) => m !== k) })}>
                          <Trash2 className="h-4 w-4" aria-hidden="true" />
                        </Button>
                      </Td>
                    </tr>
                  );
                })}
              </TBody>
            </Table>
          </div>
          <Button
            variant="secondary"
            className="mt-2"
            onClick={() =>
              updateStage(i, {
                parameters: [...stage.parameters, { uid: uid(), key: `${stage.kind}.`, name: "", kind: "time", setpoint: "", unit: "s", validatedLow: "", validatedHigh: "", critical: false, isNew: true }],
              })
            }
          >
            <Plus className="h-4 w-4" aria-hidden="true" /> Add parameter to stage {i + 1}
          </Button>
        </fieldset>
      ))}
      <Button variant="secondary" onClick={() => setStages((all) => [...all, { uid: uid(), name: "", kind: "rinse", mode: "", parameters: [] }])}>
        <Plus className="h-4 w-4" aria-hidden="true" /> Add stage
      </Button>

      <div className="grid gap-4 md:grid-cols-[14rem_1fr]">
        <SelectInput
          label="Raise the classification"
          path="raiseTo"
          value={raiseTo}
          onChange={setRaiseTo}
          options={[
            ["", `Keep the computed class (${props.computed})`],
            ["minor", "Raise to minor"],
            ["major", "Raise to major"],
          ]}
        />
        <TextInput label="Reason for raising" path="raiseReason" value={raiseReason} onChange={setRaiseReason} />
      </div>
      <SubmitButton pendingText="Saving…">Save proposal</SubmitButton>
    </ActionForm>
  );
}

function useError(path: string) {
  const { state } = useFormResult();
  return state && !state.ok ? state.fieldErrors?.[path] : undefined;
}

const inputClass = "block w-full rounded-md border border-stone-300 bg-white px-2.5 py-1.5 text-sm aria-invalid:border-red-700";

interface InputProps {
  label: string;
  path: string;
  value: string;
  onChange: (v: string) => void;
  /** In a table cell the column header shows the label, so the input carries it as aria-label. */
  cell?: boolean;
}

/** A labelled control with its server error beside it, read by the error's field path. */
function Labelled({ label, path, cell, children }: { label: string; path: string; cell?: boolean; children: (id: string, invalid: true | undefined) => ReactNode }) {
  const id = useId();
  const invalid = useError(path) ? true : undefined;
  return (
    <div className={cell ? "max-w-56" : "space-y-1"}>
      {!cell && (
        <label htmlFor={id} className="block text-sm font-medium text-stone-800">
          {label}
        </label>
      )}
      {children(id, invalid)}
      <FieldError name={path} />
    </div>
  );
}

function TextInput({ label, path, value, onChange, cell, narrow, ...rest }: InputProps & { narrow?: boolean; inputMode?: "decimal"; placeholder?: string; list?: string }) {
  return (
    <Labelled label={label} path={path} cell={cell}>
      {(id, invalid) => (
        <input id={id} aria-label={cell ? label : undefined} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={invalid} className={`${inputClass} ${narrow ? "w-24" : cell ? "min-w-40" : ""}`} {...rest} />
      )}
    </Labelled>
  );
}

function TextArea({ label, path, value, onChange, rows, hint }: InputProps & { rows: number; hint?: string }) {
  return (
    <Labelled label={label} path={path}>
      {(id, invalid) => (
        <>
          <textarea id={id} rows={rows} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={invalid} aria-describedby={`${id}-h`} className={inputClass} />
          <p id={`${id}-h`} className="text-xs text-stone-600">
            {hint}
          </p>
        </>
      )}
    </Labelled>
  );
}

function SelectInput({ label, path, value, onChange, options, cell }: InputProps & { options: [string, string][] }) {
  return (
    <Labelled label={label} path={path} cell={cell}>
      {(id, invalid) => (
        <select id={id} aria-label={cell ? label : undefined} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={invalid} className={inputClass}>
          {options.map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      )}
    </Labelled>
  );
}
