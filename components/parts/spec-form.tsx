"use client";

import { ActionForm, useFormResult } from "@/components/ui/action-form";
import {
  CheckboxField,
  ChoiceGroup,
  Field,
  NumberField,
  SelectField,
  TextareaField,
} from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/result";
import type { LimitChange } from "@/lib/specs/compare";
import { CccField } from "./ccc-field";
import { SpecSourceUpload } from "./spec-source-upload";

export interface SpecValues {
  id?: string;
  code: string;
  name: string;
  customer: string | null;
  documentNumber: string | null;
  revision: string;
  ccc: string;
  maxMetallicUm: number | null;
  maxNonMetallicUm: number | null;
  maxFibreUm: number | null;
  gravimetricLimitMg: number | null;
  gravimetricBasis: string | null;
  minWettingTensionMNm: number | null;
  visualCriteria: string | null;
  drynessCriteria: string | null;
  extraRequirements: string | null;
  customerApprovesChanges: boolean;
  source?: { id: string; name: string } | null;
}

type Affected = {
  partFamilies: { id: string; code: string; name: string }[];
  recipes: { recipeVersionId: string; code: string; version: number; status: string }[];
};
type RevisionState = FormState & {
  newSpecId?: string;
  changes?: LimitChange[];
  tightens?: boolean;
  affected?: Affected;
};

const text = (v: string | number | null | undefined) =>
  v === null || v === undefined ? "" : String(v);
const DIRECTION_WORDS: Record<LimitChange["direction"], string> = {
  tightened: "Tightened",
  loosened: "Loosened",
  both: "Tightened and loosened",
  changed: "Changed",
};

/** After a revision is saved: what changed and, when a limit tightened, what was validated against the looser one. */
function RevisionOutcome() {
  const { state } = useFormResult();
  const s = state as RevisionState;
  if (!s?.ok || !s.changes) return null;
  return (
    <section
      aria-label="What the revision changes"
      className="space-y-2 rounded-md border border-stone-200 bg-white p-4 text-sm"
    >
      <h2 className="font-semibold">What the revision changes</h2>
      {s.changes.length === 0 ? (
        <p>No limit changed.</p>
      ) : (
        <ul className="list-disc pl-5">
          {s.changes.map((c) => (
            <li key={c.field}>
              <strong>{DIRECTION_WORDS[c.direction]}:</strong> {c.reason}
            </li>
          ))}
        </ul>
      )}
      {s.tightens && s.affected && (
        <>
          <p className="font-medium">
            A limit tightened: these were validated against the previous revision and need review.
          </p>
          <p>
            Part families:{" "}
            {s.affected.partFamilies.length
              ? s.affected.partFamilies.map((f) => `${f.code} (${f.name})`).join(", ")
              : "none"}
            .
          </p>
          <p>
            Recipe versions qualified for them:{" "}
            {s.affected.recipes.length
              ? s.affected.recipes.map((r) => `${r.code} v${r.version} (${r.status})`).join(", ")
              : "none"}
            .
          </p>
        </>
      )}
      {s.newSpecId && (
        <p>
          <a className="text-brand-800 underline" href={`/parts/specs/${s.newSpecId}`}>
            Open the new revision
          </a>
        </p>
      )}
    </section>
  );
}

/**
 * A new specification in the register, or a new revision of the one in force (`revising`): the
 * revision supersedes it, and the form then shows what the revision changed and affects.
 */
export function SpecForm({
  action,
  values,
  families,
  revising = false,
}: {
  action: (prev: FormState, formData: FormData) => Promise<FormState>;
  values?: SpecValues;
  families: { id: string; code: string; name: string }[];
  revising?: boolean;
}) {
  return (
    <ActionForm
      action={action}
      className="max-w-4xl space-y-6"
      aria-label={revising ? "New revision" : "New specification"}
    >
      {revising && values?.id && <input type="hidden" name="specId" value={values.id} />}
      <RevisionOutcome />
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Document</legend>
        {revising ? (
          <p className="text-sm sm:col-span-2">
            Register code <span className="font-mono">{values?.code}</span>; the revision in force
            is {values?.revision}.
          </p>
        ) : (
          <Field
            name="code"
            label="Register code"
            defaultValue={text(values?.code)}
            hint="Our name for the specification across its revisions, e.g. CS-VB-01."
          />
        )}
        <Field name="name" label="Title" defaultValue={text(values?.name)} />
        <Field name="customer" label="Customer" defaultValue={text(values?.customer)} />
        <Field
          name="documentNumber"
          label="Customer document number"
          defaultValue={text(values?.documentNumber)}
        />
        <Field
          name="revision"
          label={revising ? "New revision" : "Revision"}
          defaultValue={revising ? "" : text(values?.revision)}
          hint="As the customer's document names it, e.g. C or 04."
        />
        <SpecSourceUpload current={revising ? null : values?.source} />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Particle limits</legend>
        <CccField defaultValue={text(values?.ccc)} />
        <NumberField
          name="maxMetallicUm"
          label="Largest metallic particle (µm, optional)"
          unit="µm"
          defaultValue={text(values?.maxMetallicUm)}
        />
        <NumberField
          name="maxNonMetallicUm"
          label="Largest non-metallic particle (µm, optional)"
          unit="µm"
          defaultValue={text(values?.maxNonMetallicUm)}
        />
        <NumberField
          name="maxFibreUm"
          label="Largest fibre (µm, optional)"
          unit="µm"
          defaultValue={text(values?.maxFibreUm)}
        />
      </fieldset>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-base font-semibold">Residue, surface and dryness</legend>
        <NumberField
          name="gravimetricLimitMg"
          label="Gravimetric limit (mg, optional)"
          unit="mg"
          defaultValue={text(values?.gravimetricLimitMg)}
        />
        <SelectField
          name="gravimetricBasis"
          label="Gravimetric limit applies"
          defaultValue={text(values?.gravimetricBasis)}
          placeholder="(no gravimetric limit)"
          options={[
            { value: "per_component", label: "per part" },
            { value: "per_1000_cm2", label: "per 1000 cm² of wetted area" },
          ]}
        />
        <NumberField
          name="minWettingTensionMNm"
          label="Minimum wetting tension (mN/m, optional)"
          unit="mN/m"
          defaultValue={text(values?.minWettingTensionMNm)}
          hint="For parts painted or bonded after cleaning; test inks."
        />
        <div />
        <TextareaField
          name="visualCriteria"
          label="Visual criteria (optional)"
          rows={2}
          defaultValue={text(values?.visualCriteria)}
        />
        <TextareaField
          name="drynessCriteria"
          label="Dryness criteria (optional)"
          rows={2}
          defaultValue={text(values?.drynessCriteria)}
        />
        <TextareaField
          name="extraRequirements"
          label="Extra requirements (optional)"
          rows={3}
          defaultValue={text(values?.extraRequirements)}
          className="sm:col-span-2"
        />
        <CheckboxField
          name="customerApprovesChanges"
          label="Customer must approve process changes"
          defaultChecked={values?.customerApprovesChanges ?? false}
          className="sm:col-span-2"
        />
      </fieldset>
      {families.length > 0 && (
        <ChoiceGroup
          type="checkbox"
          name="partFamilyIds"
          legend={
            revising
              ? "Also apply to these part families (families on the previous revision move anyway)"
              : "Part families it applies to (optional)"
          }
          options={families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` }))}
        />
      )}
      {revising && (
        <TextareaField
          name="reason"
          label="Reason for the revision"
          rows={2}
          hint="e.g. Customer issued revision C with a tighter class J–K limit."
        />
      )}
      <SubmitButton pendingText="Saving…">
        {revising ? "Save revision" : "Register specification"}
      </SubmitButton>
    </ActionForm>
  );
}
