"use client";

import { CheckboxField, Field, NumberField, SelectField } from "@/components/ui/field";
import { AddRowButton, RemoveRowButton, type RowList } from "@/components/ui/row-list";
import { Caution } from "@/components/ui/caution";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { PARAMETER_KINDS, STAGE_KINDS, STAGE_MODES, type ParameterKind } from "@/db/enums";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import { appendRow, removeRow, rowsOf, updateRow, valuesOf, type Row } from "@/lib/forms/rows";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";
import { hazardsOfStages } from "@/lib/recipes/hazards";
import { PARAMETER_KIND_LABELS, UNITS_BY_KIND } from "@/lib/recipes/units";

type Text = string;
export interface ParamDraft {
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
export interface StageDraft {
  name: Text;
  kind: (typeof STAGE_KINDS)[number];
  mode: (typeof STAGE_MODES)[number] | "";
  parameters: Row<ParamDraft>[];
}

const num = (v: number | null) => (v === null ? "" : String(v));

/** A recipe version's stages as the editor holds them: numbers as the text typed. */
export function stageDraftsOf(stages: RecipeSnapshot["stages"]): StageDraft[] {
  return stages.map((s) => ({
    name: s.name,
    kind: s.kind as StageDraft["kind"],
    mode: (s.mode ?? "") as StageDraft["mode"],
    parameters: rowsOf(
      s.parameters.map((p) => ({
        key: p.key,
        name: p.name,
        kind: p.kind,
        setpoint: num(p.setpoint),
        unit: p.unit,
        validatedLow: num(p.validatedLow),
        validatedHigh: num(p.validatedHigh),
        critical: p.critical,
        isNew: false,
      })),
    ),
  }));
}

/** The stages as the schema reads them (recipeContentSchema's `stages`). */
export function stagesPayload(values: readonly StageDraft[]) {
  return values.map((s) => ({
    name: s.name,
    kind: s.kind,
    mode: s.mode || null,
    parameters: valuesOf(s.parameters).map(({ isNew: _n, ...p }) => p),
  }));
}

export interface RecipeStagesEditorProps {
  stages: RowList<StageDraft>;
  /** Where the schema reports this content's errors, e.g. "recipe" or "content". */
  errorPrefix: string;
}

/**
 * Stages in process order with their modes and parameters, and the cautions for hot, chemical and
 * noisy settings kept in view while typing. Shared by a new recipe and a change proposal.
 */
export function RecipeStagesEditor({ stages, errorPrefix }: RecipeStagesEditorProps) {
  const hazards = hazardsOfStages(
    stages.values.map((s) => ({
      mode: s.mode || null,
      parameters: valuesOf(s.parameters).map((p) => ({
        kind: p.kind,
        unit: p.unit,
        setpoint: Number(p.setpoint) || 0,
        validatedHigh: p.validatedHigh === "" ? null : Number(p.validatedHigh),
      })),
    })),
  );

  const updateParam = (i: number, k: number, patch: Partial<ParamDraft>) =>
    stages.update(i, (s) => ({ ...s, parameters: updateRow(s.parameters, k, patch) }));

  return (
    <>
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
      {stages.rows.map(({ key: stageKey, value: stage }, i) => (
        <fieldset key={stageKey} className="rounded-lg border border-stone-200 bg-white p-4">
          <legend className="px-1 text-sm font-semibold text-stone-800">
            Stage {i + 1}: {stage.name || "unnamed"}
          </legend>
          <div className="grid gap-3 md:grid-cols-[1fr_12rem_12rem_auto]">
            <Field
              label={`Name of stage ${i + 1}`}
              errorKey={`${errorPrefix}.stages.${i}.name`}
              value={stage.name}
              onValueChange={(v) => stages.update(i, { name: v })}
            />
            <SelectField
              label={`Kind of stage ${i + 1}`}
              errorKey={`${errorPrefix}.stages.${i}.kind`}
              value={stage.kind}
              onValueChange={(v) => stages.update(i, { kind: v as StageDraft["kind"] })}
              options={STAGE_KIND_OPTIONS}
            />
            <SelectField
              label={`Mode of stage ${i + 1}`}
              errorKey={`${errorPrefix}.stages.${i}.mode`}
              value={stage.mode}
              onValueChange={(v) => stages.update(i, { mode: v as StageDraft["mode"] })}
              placeholder="None"
              options={STAGE_MODE_OPTIONS}
            />
            <div className="flex items-end">
              <RemoveRowButton label={`Remove stage ${i + 1}`} onRemove={() => stages.remove(i)}>
                Remove stage
              </RemoveRowButton>
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
                {stage.parameters.map(({ key: rowKey, value: p }, k) => {
                  const path = `${errorPrefix}.stages.${i}.parameters.${k}`;
                  const label = p.name || `parameter ${k + 1} of stage ${i + 1}`;
                  const cell = { hideLabel: true, dense: true } as const;
                  return (
                    <tr key={rowKey}>
                      <Td>
                        <Field
                          {...cell}
                          className="max-w-56 min-w-40"
                          label={`Name of ${label}`}
                          errorKey={`${path}.name`}
                          value={p.name}
                          onValueChange={(v) => updateParam(i, k, { name: v })}
                        />
                        {p.isNew ? (
                          <Field
                            {...cell}
                            className="max-w-56 min-w-40"
                            label={`Key of ${label}`}
                            errorKey={`${path}.key`}
                            value={p.key}
                            onValueChange={(v) => updateParam(i, k, { key: v })}
                            placeholder="stage.parameter"
                          />
                        ) : (
                          <p className="mt-0.5 font-mono text-xs text-stone-500">{p.key}</p>
                        )}
                      </Td>
                      <Td>
                        <SelectField
                          {...cell}
                          label={`Kind of ${label}`}
                          errorKey={`${path}.kind`}
                          value={p.kind}
                          onValueChange={(v) =>
                            updateParam(i, k, {
                              kind: v as ParameterKind,
                              unit: UNITS_BY_KIND[v as ParameterKind][0] ?? p.unit,
                            })
                          }
                          options={PARAMETER_KIND_OPTIONS}
                        />
                      </Td>
                      <Td>
                        <NumberField
                          {...cell}
                          label={`Setpoint of ${label}`}
                          errorKey={`${path}.setpoint`}
                          value={p.setpoint}
                          onValueChange={(v) => updateParam(i, k, { setpoint: v })}
                        />
                      </Td>
                      <Td>
                        <Field
                          {...cell}
                          className="w-24"
                          label={`Unit of ${label}`}
                          errorKey={`${path}.unit`}
                          value={p.unit}
                          onValueChange={(v) => updateParam(i, k, { unit: v })}
                          list={`units-${p.kind}`}
                        />
                      </Td>
                      <Td>
                        <NumberField
                          {...cell}
                          label={`Validated low of ${label}`}
                          errorKey={`${path}.validatedLow`}
                          value={p.validatedLow}
                          onValueChange={(v) => updateParam(i, k, { validatedLow: v })}
                        />
                      </Td>
                      <Td>
                        <NumberField
                          {...cell}
                          label={`Validated high of ${label}`}
                          errorKey={`${path}.validatedHigh`}
                          value={p.validatedHigh}
                          onValueChange={(v) => updateParam(i, k, { validatedHigh: v })}
                        />
                      </Td>
                      <Td className="pt-2">
                        <CheckboxField
                          hideLabel
                          label={`Critical: ${label}`}
                          errorKey={`${path}.critical`}
                          checked={p.critical}
                          onCheckedChange={(on) => updateParam(i, k, { critical: on })}
                        />
                      </Td>
                      <Td>
                        <RemoveRowButton
                          label={`Remove ${label}`}
                          onRemove={() =>
                            stages.update(i, (s) => ({
                              ...s,
                              parameters: removeRow(s.parameters, k),
                            }))
                          }
                        />
                      </Td>
                    </tr>
                  );
                })}
              </TBody>
            </Table>
          </div>
          <AddRowButton
            className="mt-2"
            onAdd={() =>
              stages.update(i, (s) => ({
                ...s,
                parameters: appendRow(s.parameters, {
                  key: `${s.kind}.`,
                  name: "",
                  kind: "time",
                  setpoint: "",
                  unit: "s",
                  validatedLow: "",
                  validatedHigh: "",
                  critical: false,
                  isNew: true,
                }),
              }))
            }
          >
            Add parameter to stage {i + 1}
          </AddRowButton>
        </fieldset>
      ))}
      <AddRowButton onAdd={() => stages.add({ name: "", kind: "rinse", mode: "", parameters: [] })}>
        Add stage
      </AddRowButton>
    </>
  );
}

const STAGE_KIND_OPTIONS = STAGE_KINDS.map((k) => ({ value: k, label: humanize(k) }));
const STAGE_MODE_OPTIONS = STAGE_MODES.map((m) => ({ value: m, label: STAGE_MODE_LABELS[m] }));
const PARAMETER_KIND_OPTIONS = PARAMETER_KINDS.map((x) => ({
  value: x,
  label: PARAMETER_KIND_LABELS[x],
}));
