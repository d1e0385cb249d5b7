"use client";

import { useState } from "react";
import { ActionForm } from "@/components/ui/action-form";
import { Caution } from "@/components/ui/caution";
import {
  ChoiceGroup,
  Field,
  FieldError,
  NumberField,
  SelectField,
  TextareaField,
} from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { LabMethodKind } from "@/db/enums";
import type { FormState } from "@/lib/actions/result";
import { PARTICLE_DISTINCTION_LABELS, PARTICLE_DISTINCTIONS } from "@/lib/lab-methods/rules";
import {
  ANALYSIS_SYSTEM_LABELS,
  ANALYSIS_SYSTEMS,
  EXTRACTION_PROCEDURE_LABELS,
  EXTRACTION_PROCEDURES,
} from "@/lib/schemas/lab-details";
import { LAB_METHOD_KIND_LABELS } from "@/lib/schemas/lab-method";

export interface MethodFormProps {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  /** A new version starts from the version it revises; code and kind then stay as they are. */
  from: {
    code: string;
    kind: LabMethodKind;
    name: string;
    trainingIntervalMonths: number;
    qualificationRunId: string | null;
    details: Record<string, unknown>;
  } | null;
  /** Verified particle runs an extraction procedure may cite as its qualification. */
  runs: { id: string; label: string }[];
}

const str = (v: unknown) => (v === null || v === undefined ? "" : String(v));

/** Drafts a lab method or the next version of one: the fields follow the kind chosen. */
export function MethodForm({ action, from, runs }: MethodFormProps) {
  const [kind, setKind] = useState<string>(from?.kind ?? "");
  const d = from?.details ?? {};
  const ticked = Array.isArray(d.distinguishes) ? (d.distinguishes as string[]) : [];
  return (
    <ActionForm action={action} aria-label="Lab method" className="max-w-3xl space-y-4">
      <div className="grid gap-4 sm:grid-cols-2">
        {from ? (
          <>
            <input type="hidden" name="kind" value={from.kind} />
            <input type="hidden" name="code" value={from.code} />
            <p className="text-sm sm:col-span-2">
              Next version of <span className="font-semibold">{from.code}</span> (
              {LAB_METHOD_KIND_LABELS[from.kind].toLowerCase()}).
            </p>
          </>
        ) : (
          <>
            <SelectField
              name="kind"
              label="Kind of method"
              placeholder="Choose…"
              value={kind}
              onValueChange={setKind}
              options={(["extraction", "analysis", "gravimetric"] as const).map((k) => ({
                value: k,
                label: LAB_METHOD_KIND_LABELS[k],
              }))}
            />
            <Field name="code" label="Code" hint="Names the method across versions, e.g. EX-01." />
          </>
        )}
        <Field name="name" label="Name" defaultValue={from?.name ?? ""} className="sm:col-span-2" />
        <NumberField
          name="trainingIntervalMonths"
          label="Training interval"
          unit="months"
          integer
          defaultValue={str(from?.trainingIntervalMonths ?? 24)}
          hint="How long a practical sign-off stays current."
        />
      </div>

      {kind === "extraction" && (
        <fieldset className="grid gap-4 rounded-md border border-stone-200 p-4 sm:grid-cols-2">
          <legend className="px-1 text-sm font-semibold">Extraction</legend>
          <Caution title="Extraction liquids and spray pressure">
            Extraction liquids may be flammable or harmful and a pressure-rinsing jet injures skin
            and eyes: work under extraction with eye protection, as the liquid&apos;s safety data
            sheet and the site&apos;s procedures require.
          </Caution>
          <SelectField
            name="details.procedure"
            label="Procedure"
            placeholder="Choose…"
            defaultValue={str(d.procedure)}
            options={EXTRACTION_PROCEDURES.map((p) => ({
              value: p,
              label: EXTRACTION_PROCEDURE_LABELS[p],
            }))}
          />
          <Field name="details.liquid" label="Extraction liquid" defaultValue={str(d.liquid)} />
          <NumberField
            name="details.volumeMl"
            label="Liquid volume"
            unit="mL"
            defaultValue={str(d.volumeMl)}
          />
          <NumberField
            name="details.pressureBar"
            label="Pressure"
            unit="bar"
            defaultValue={str(d.pressureBar)}
          />
          <NumberField
            name="details.flowLPerMin"
            label="Flow"
            unit="L/min"
            defaultValue={str(d.flowLPerMin)}
          />
          <NumberField
            name="details.durationS"
            label="Extraction time"
            unit="s"
            defaultValue={str(d.durationS)}
          />
          <NumberField
            name="details.extractions"
            label="Number of extractions"
            integer
            defaultValue={str(d.extractions)}
          />
          <TextareaField
            name="details.controlledSurface"
            label="Controlled surface"
            defaultValue={str(d.controlledSurface)}
            className="sm:col-span-2"
          />
          <SelectField
            name="qualificationRunId"
            label="Declining test that qualified it"
            placeholder="Not yet qualified"
            defaultValue={str(from?.qualificationRunId)}
            options={runs.map((r) => ({ value: r.id, label: r.label }))}
            hint="A verified particle run whose extraction series met the declining test."
            className="sm:col-span-2"
          />
        </fieldset>
      )}

      {(kind === "analysis" || kind === "gravimetric") && (
        <fieldset className="grid gap-4 rounded-md border border-stone-200 p-4 sm:grid-cols-2">
          <legend className="px-1 text-sm font-semibold">Filter</legend>
          <Field
            name="details.filterMaterial"
            label="Filter membrane material"
            defaultValue={str(d.filterMaterial)}
          />
          <NumberField
            name="details.poreSizeUm"
            label="Pore size"
            unit="µm"
            defaultValue={str(d.poreSizeUm)}
          />
        </fieldset>
      )}

      {kind === "analysis" && (
        <fieldset className="grid gap-4 rounded-md border border-stone-200 p-4 sm:grid-cols-2">
          <legend className="px-1 text-sm font-semibold">Analysis</legend>
          <SelectField
            name="details.system"
            label="Analysis system"
            placeholder="Choose…"
            defaultValue={str(d.system)}
            options={ANALYSIS_SYSTEMS.map((s) => ({ value: s, label: ANALYSIS_SYSTEM_LABELS[s] }))}
          />
          <NumberField
            name="details.magnification"
            label="Magnification"
            unit="×"
            defaultValue={str(d.magnification)}
          />
          <NumberField
            name="details.lowerSizeLimitUm"
            label="Lower size limit"
            unit="µm"
            defaultValue={str(d.lowerSizeLimitUm)}
          />
          <div className="sm:col-span-2">
            <ChoiceGroup
              type="checkbox"
              name="distinguishes"
              legend="Particle types the system tells apart"
              inline
              defaultValues={ticked}
              hint="“Metallic” needs element analysis: only with SEM/EDX."
              options={PARTICLE_DISTINCTIONS.map((p) => ({
                value: p,
                label: PARTICLE_DISTINCTION_LABELS[p],
              }))}
            />
            <FieldError name="details.distinguishes" />
          </div>
          <Caution title="UV-A lamps">
            Some microscopes light the membrane with UV-A: do not look into the lamp and keep its
            shield in place, as the instrument&apos;s manual says.
          </Caution>
        </fieldset>
      )}

      {kind === "gravimetric" && (
        <fieldset className="grid gap-4 rounded-md border border-stone-200 p-4 sm:grid-cols-2">
          <legend className="px-1 text-sm font-semibold">Weighing</legend>
          <NumberField
            name="details.balanceResolutionMg"
            label="Balance resolution"
            unit="mg"
            defaultValue={str(d.balanceResolutionMg)}
          />
          <NumberField
            name="details.practicalLowerLimitMg"
            label="Practical lower limit"
            unit="mg"
            defaultValue={str(d.practicalLowerLimitMg)}
            hint="Below it a residue is not qualified: pool more parts."
          />
          <NumberField
            name="details.dryingTemperatureC"
            label="Drying temperature"
            unit="°C"
            defaultValue={str(d.dryingTemperatureC)}
          />
          <NumberField
            name="details.dryingTimeMin"
            label="Drying time"
            unit="min"
            defaultValue={str(d.dryingTimeMin)}
          />
          <TextareaField
            name="details.weighingConditions"
            label="Weighing conditions"
            hint="Cooling in the desiccator, room climate, weighing to constant mass."
            defaultValue={str(d.weighingConditions)}
            className="sm:col-span-2"
          />
          <TextareaField
            name="details.poolingRule"
            label="Pooling rule"
            hint="How many components go on one filter so the residue clears the practical lower limit."
            defaultValue={str(d.poolingRule)}
            className="sm:col-span-2"
          />
          <Caution title="Hot drying oven">
            Filters and dishes leave the oven hot enough to burn: use tongs and let them cool in the
            desiccator.
          </Caution>
        </fieldset>
      )}

      <SubmitButton>Save draft</SubmitButton>
    </ActionForm>
  );
}
