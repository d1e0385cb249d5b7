"use client";

import { IntentLink } from "@/components/ui/intent-link";
import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Caution } from "@/components/ui/caution";
import { CheckboxField, Field, FieldError, NumberField, SelectField } from "@/components/ui/field";
import {
  AddRowButton,
  MoveRowButtons,
  PayloadField,
  RemoveRowButton,
  useRowList,
} from "@/components/ui/row-list";
import { SubmitButton } from "@/components/ui/submit-button";
import { STAGE_KINDS, STAGE_MODES } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { humanize, STAGE_MODE_LABELS, SYSTEM_KIND_LABELS } from "@/lib/format/labels";
import { hazardsOfEquipment } from "@/lib/plant/equipment-hazards";

/** A stage as typed: numbers stay text until the schema parses them, so nothing typed is lost. */
interface StageDraft {
  id: string | null;
  name: string;
  kind: string;
  capabilities: string[];
  tankVolumeL: string;
  filterRatingUm: string;
  ultrasonicPowerW: string;
  ultrasonicFrequencyKHz: string;
  sprayPressureBar: string;
  injectionPressureBar: string;
  nozzleSet: string;
}

export interface SystemEditorStage {
  id: string;
  name: string;
  kind: string;
  capabilities: string[];
  tankVolumeL: number | null;
  filterRatingUm: number | null;
  ultrasonicPowerW: number | null;
  ultrasonicFrequencyKHz: number | null;
  sprayPressureBar: number | null;
  injectionPressureBar: number | null;
  nozzleSet: string | null;
}

type Action = (prev: FormState, formData: FormData) => Promise<FormState>;

export type SystemEditorProps =
  | {
      mode: "create";
      action: Action;
      sites: { id: string; name: string }[];
    }
  | {
      mode: "edit";
      action: Action;
      system: { id: string; name: string; description: string | null; stages: SystemEditorStage[] };
      /** The effective recipes the system runs: equipment edits then go through change control. */
      runs: string[];
    };

const KIND_OPTIONS = STAGE_KINDS.map((k) => ({ value: k, label: humanize(k) }));
const SYSTEM_KIND_OPTIONS = Object.entries(SYSTEM_KIND_LABELS).map(([value, label]) => ({
  value,
  label,
}));
const DRYER_MODES = ["hot_air_drying", "vacuum_drying"];
/** A dryer picks its kind (hot air or vacuum); a bath stage the ways it moves the liquid. */
const modesFor = (kind: string) =>
  kind === "drying"
    ? DRYER_MODES
    : kind === "other"
      ? [...STAGE_MODES]
      : STAGE_MODES.filter((m) => !DRYER_MODES.includes(m));

const text = (v: number | string | null) => (v === null ? "" : String(v));
const draftOf = (s: SystemEditorStage): StageDraft => ({
  id: s.id,
  name: s.name,
  kind: s.kind,
  capabilities: s.capabilities,
  tankVolumeL: text(s.tankVolumeL),
  filterRatingUm: text(s.filterRatingUm),
  ultrasonicPowerW: text(s.ultrasonicPowerW),
  ultrasonicFrequencyKHz: text(s.ultrasonicFrequencyKHz),
  sprayPressureBar: text(s.sprayPressureBar),
  injectionPressureBar: text(s.injectionPressureBar),
  nozzleSet: text(s.nozzleSet),
});
const emptyStage = (kind: string): StageDraft => ({
  id: null,
  name: "",
  kind,
  capabilities: [],
  tankVolumeL: "",
  filterRatingUm: "",
  ultrasonicPowerW: "",
  ultrasonicFrequencyKHz: "",
  sprayPressureBar: "",
  injectionPressureBar: "",
  nozzleSet: "",
});

/** What is sent: a figure of a mode the stage no longer runs is cleared, not kept out of sight. */
function payloadStage(s: StageDraft) {
  const has = (m: string) => s.capabilities.includes(m);
  return {
    ...s,
    ultrasonicPowerW: has("ultrasonic") ? s.ultrasonicPowerW : "",
    ultrasonicFrequencyKHz: has("ultrasonic") ? s.ultrasonicFrequencyKHz : "",
    sprayPressureBar: has("spray") ? s.sprayPressureBar : "",
    injectionPressureBar: has("injection") ? s.injectionPressureBar : "",
    nozzleSet: has("spray") || has("injection") ? s.nozzleSet : "",
  };
}

const typedNumber = (v: string) =>
  v.trim() === "" || !Number.isFinite(Number(v.replace(",", ".")))
    ? null
    : Number(v.replace(",", "."));

/**
 * The administrator's editor for a washer: to create one (codes, kind, site) or edit one (name,
 * description), and its stages in process order with the equipment each carries.
 */
export function SystemEditor(props: SystemEditorProps) {
  const editing = props.mode === "edit" ? props.system : null;
  const [name, setName] = useState(editing?.name ?? "");
  const [description, setDescription] = useState(editing?.description ?? "");
  const [code, setCode] = useState("");
  const [assetNumber, setAssetNumber] = useState("");
  const [kind, setKind] = useState("multi_tank_aqueous");
  const [siteId, setSiteId] = useState(
    props.mode === "create" && props.sites.length === 1 ? props.sites[0].id : "",
  );
  const stages = useRowList<StageDraft>(() =>
    editing ? editing.stages.map(draftOf) : [emptyStage("wash")],
  );
  const payloadStages = stages.values.map(payloadStage);
  const payload = editing
    ? { systemId: editing.id, name, description, stages: payloadStages }
    : { code, assetNumber, name, kind, description, siteId, stages: payloadStages };
  const hazards = hazardsOfEquipment(
    stages.values.map((s) => ({
      kind: s.kind,
      capabilities: s.capabilities,
      tankVolumeL: typedNumber(s.tankVolumeL),
      filterRatingUm: typedNumber(s.filterRatingUm),
    })),
  );

  return (
    <ActionForm
      action={props.action}
      className="space-y-4"
      aria-label={editing ? "Edit cleaning system" : "New cleaning system"}
    >
      <PayloadField value={payload} />
      {props.mode === "edit" && props.runs.length > 0 && (
        <p
          role="note"
          className="rounded-md border border-stone-300 bg-stone-50 px-3 py-2 text-sm text-stone-800"
        >
          This system runs the effective recipe{props.runs.length === 1 ? "" : "s"}{" "}
          {props.runs.join(", ")}: their validation rests on its equipment as it is. Names and
          descriptions are saved directly; saving an equipment change opens a change request of kind
          &ldquo;equipment&rdquo; instead, and the washer changes when that request closes (
          <IntentLink href="/changes" className="text-brand-800 underline">
            Changes
          </IntentLink>
          ).
        </p>
      )}
      {props.mode === "create" && (
        <div className="grid gap-3 md:grid-cols-3">
          <Field
            label="Short code"
            errorKey="code"
            value={code}
            onValueChange={setCode}
            hint="Letters, digits and . _ / -, e.g. AW-4."
          />
          <Field
            label="Asset number"
            errorKey="assetNumber"
            value={assetNumber}
            onValueChange={setAssetNumber}
            hint="The plant's asset register number; optional."
          />
          <SelectField
            label="Kind of system"
            errorKey="kind"
            value={kind}
            onValueChange={setKind}
            options={SYSTEM_KIND_OPTIONS}
          />
          <SelectField
            label="Site"
            errorKey="siteId"
            value={siteId}
            onValueChange={setSiteId}
            options={props.sites.map((s) => ({ value: s.id, label: s.name }))}
            placeholder="Choose…"
          />
        </div>
      )}
      <div className="grid gap-3 md:grid-cols-2">
        <Field label="System name" errorKey="name" value={name} onValueChange={setName} />
        <Field
          label="Description"
          errorKey="description"
          value={description}
          onValueChange={setDescription}
        />
      </div>
      {hazards.length > 0 && (
        <div className="space-y-2">
          {hazards.map((h) => (
            <Caution key={h.kind} title={h.title}>
              {h.text}
            </Caution>
          ))}
        </div>
      )}
      <p className="text-sm text-stone-600">
        Stages in process order: wash, rinse, final rinse, drying.
      </p>
      {stages.rows.map(({ key, value: s }, i) => {
        const n = i + 1;
        const has = (m: string) => s.capabilities.includes(m);
        const set = (field: keyof StageDraft) => (v: string) =>
          stages.update(i, { [field]: v } as Partial<StageDraft>);
        return (
          <fieldset key={key} className="rounded-md border border-stone-200 p-3">
            <legend className="px-1 text-sm font-semibold">Stage {n}</legend>
            <div className="grid gap-3 md:grid-cols-4">
              <Field
                label={`Name of stage ${n}`}
                errorKey={`stages.${i}.name`}
                value={s.name}
                onValueChange={set("name")}
              />
              <SelectField
                label={`Kind of stage ${n}`}
                errorKey={`stages.${i}.kind`}
                value={s.kind}
                // A dryer cannot flood and a bath cannot vacuum-dry: modes of the old kind go.
                onValueChange={(v) =>
                  stages.update(i, (st) => ({
                    ...st,
                    kind: v,
                    capabilities: st.capabilities.filter((c) => modesFor(v).includes(c)),
                  }))
                }
                options={KIND_OPTIONS}
              />
              <NumberField
                label={`Tank volume of stage ${n} (L)`}
                errorKey={`stages.${i}.tankVolumeL`}
                value={s.tankVolumeL}
                onValueChange={set("tankVolumeL")}
                hint="The bath; empty for a dryer."
              />
              <NumberField
                label={`Filter rating of stage ${n} (µm)`}
                errorKey={`stages.${i}.filterRatingUm`}
                value={s.filterRatingUm}
                onValueChange={set("filterRatingUm")}
                hint="Finest filter on its circuit; empty if none."
              />
            </div>
            <fieldset className="mt-2">
              <legend className="text-sm font-medium">Stage {n} can run</legend>
              <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
                {modesFor(s.kind).map((m) => (
                  <CheckboxField
                    key={m}
                    label={STAGE_MODE_LABELS[m]}
                    checked={has(m)}
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
            {(has("ultrasonic") || has("spray") || has("injection")) && (
              <div className="mt-3 grid gap-3 md:grid-cols-4">
                {has("ultrasonic") && (
                  <>
                    <NumberField
                      label={`Ultrasonic power of stage ${n} (W)`}
                      errorKey={`stages.${i}.ultrasonicPowerW`}
                      value={s.ultrasonicPowerW}
                      onValueChange={set("ultrasonicPowerW")}
                    />
                    <NumberField
                      label={`Ultrasonic frequency of stage ${n} (kHz)`}
                      errorKey={`stages.${i}.ultrasonicFrequencyKHz`}
                      value={s.ultrasonicFrequencyKHz}
                      onValueChange={set("ultrasonicFrequencyKHz")}
                    />
                  </>
                )}
                {has("spray") && (
                  <NumberField
                    label={`Spray pressure of stage ${n} (bar)`}
                    errorKey={`stages.${i}.sprayPressureBar`}
                    value={s.sprayPressureBar}
                    onValueChange={set("sprayPressureBar")}
                  />
                )}
                {has("injection") && (
                  <NumberField
                    label={`Injection pressure of stage ${n} (bar)`}
                    errorKey={`stages.${i}.injectionPressureBar`}
                    value={s.injectionPressureBar}
                    onValueChange={set("injectionPressureBar")}
                  />
                )}
                {(has("spray") || has("injection")) && (
                  <Field
                    label={`Nozzle set of stage ${n}`}
                    errorKey={`stages.${i}.nozzleSet`}
                    value={s.nozzleSet}
                    onValueChange={set("nozzleSet")}
                    hint="Drawing or part number of the fitted set."
                  />
                )}
              </div>
            )}
            <div className="mt-2 flex flex-wrap items-center gap-2">
              <MoveRowButtons
                label={`stage ${n}`}
                first={i === 0}
                last={i === stages.rows.length - 1}
                onMove={(by) => stages.move(i, by)}
              />
              {s.id === null && (stages.rows.length > 1 || editing) && (
                // Stored stages stay (tank logs refer to them); one not yet saved can go.
                <RemoveRowButton label={`Remove stage ${n}`} onRemove={() => stages.remove(i)}>
                  Remove
                </RemoveRowButton>
              )}
            </div>
          </fieldset>
        );
      })}
      <div className="flex gap-2">
        <AddRowButton onAdd={() => stages.add(emptyStage("rinse"))}>Add stage</AddRowButton>
        <SubmitButton>{editing ? "Save system" : "Create system"}</SubmitButton>
      </div>
    </ActionForm>
  );
}
