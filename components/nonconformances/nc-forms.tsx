"use client";

import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useState } from "react";
import {
  addNcAction,
  advanceNonconformanceAction,
  assignNonconformanceAction,
  cancelNonconformanceAction,
  openChangeFromActionAction,
  openNonconformanceAction,
  planEffectivenessAction,
  recordEffectivenessAction,
  saveRootCauseAction,
  setDispositionAction,
  setItemHoldAction,
  setPendingItemsHoldAction,
  updateNcAction,
} from "@/app/(app)/nonconformances/actions";
import { ActionForm } from "@/components/ui/action-form";
import {
  ChoiceGroup,
  DateField,
  Field,
  FieldError,
  FileField,
  SelectField,
  TextareaField,
} from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";
import {
  NC_ACTION_KINDS,
  NC_ACTION_STATUSES,
  NC_CAUSE_METHODS,
  NC_DISPOSITIONS,
  NC_MANUAL_KINDS,
  NC_SEVERITIES,
} from "@/db/enums";
import { CHANGE_KIND_LABELS } from "@/lib/changes/workflow";
import type { RichDoc } from "@/lib/documents/rich-text";
import {
  NC_ACTION_STATUS_LABELS,
  NC_DISPOSITION_LABELS,
  NC_MANUAL_LABELS,
  NC_METHOD_LABELS,
  NC_SEVERITY_LABELS,
} from "@/lib/nonconformances/lifecycle";
import { NC_CHANGE_KINDS } from "@/lib/schemas/nonconformance";

type Option = { value: string; label: string };
const options = <T extends string>(values: readonly T[], labels: Record<T, string>): Option[] =>
  values.map((v) => ({ value: v, label: labels[v] }));

const RootCauseEditor = dynamic(() => import("./root-cause-editor"), {
  ssr: false,
  loading: () => <p className="text-sm text-stone-600">Loading the editor…</p>,
});

/** A nonconformance reported by hand. */
export function NewNcForm(props: { recipes: Option[]; families: Option[]; today: string }) {
  return (
    <ActionForm
      action={openNonconformanceAction}
      className="grid gap-4 sm:grid-cols-2"
      aria-label="Report a nonconformance"
    >
      <SelectField
        name="manualKind"
        label="What is reported"
        options={options(NC_MANUAL_KINDS, NC_MANUAL_LABELS)}
        placeholder="Choose…"
      />
      <Field
        name="reference"
        label="Reference"
        hint="The customer's complaint or return number, or the audit finding's number."
      />
      <Field name="title" label="Title" className="sm:col-span-2" />
      <TextareaField name="description" label="What was found" className="sm:col-span-2" rows={4} />
      <SelectField
        name="severity"
        label="Severity"
        options={options(NC_SEVERITIES, NC_SEVERITY_LABELS)}
        placeholder="Choose…"
      />
      <DateField name="detectedOn" label="Detected on" defaultValue={props.today} />
      <SelectField
        name="recipeId"
        label="Recipe (optional)"
        options={props.recipes}
        placeholder="None"
      />
      <SelectField
        name="partFamilyId"
        label="Part family (optional)"
        options={props.families}
        placeholder="None"
        hint="With both, the runs since the last passing test are listed for containment."
      />
      <div className="sm:col-span-2">
        <SubmitButton>Open the nonconformance</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function AssignForm(props: {
  ncId: string;
  engineers: Option[];
  ownerId: string | null;
  dueOn: string | null;
}) {
  return (
    <ActionForm
      action={assignNonconformanceAction}
      className="flex flex-wrap items-end gap-3"
      aria-label="Owner"
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <SelectField
        name="ownerId"
        label="Owner"
        options={props.engineers}
        defaultValue={props.ownerId ?? ""}
        placeholder="Choose…"
        dense
      />
      <DateField name="dueOn" label="Due on" defaultValue={props.dueOn ?? ""} dense />
      <SubmitButton variant="secondary">Save owner</SubmitButton>
    </ActionForm>
  );
}

export function HoldButtons(props: { ncId: string; itemId: string; label: string; hold: string }) {
  return (
    <div className="flex gap-2">
      {(["held", "released"] as const)
        .filter((h) => h !== props.hold)
        .map((h) => (
          <ActionForm
            key={h}
            action={setItemHoldAction}
            aria-label={`${h === "held" ? "Hold" : "Release"} ${props.label}`}
            showSuccess={false}
          >
            <input type="hidden" name="nonconformanceId" value={props.ncId} />
            <input type="hidden" name="itemId" value={props.itemId} />
            <input type="hidden" name="hold" value={h} />
            <SubmitButton variant="secondary">{h === "held" ? "Hold" : "Release"}</SubmitButton>
          </ActionForm>
        ))}
    </div>
  );
}

/** Decides every item still pending at once: hold all, or release all shown not to be affected. */
export function PendingItemsHoldButtons(props: { ncId: string; undecided: number }) {
  const what =
    props.undecided === 1 ? "the 1 undecided item" : `all ${props.undecided} undecided items`;
  return (
    <div className="flex flex-wrap gap-2">
      {(["held", "released"] as const).map((h) => (
        <ActionForm
          key={h}
          action={setPendingItemsHoldAction}
          aria-label={`${h === "held" ? "Hold" : "Release"} ${what}`}
        >
          <input type="hidden" name="nonconformanceId" value={props.ncId} />
          <input type="hidden" name="hold" value={h} />
          <SubmitButton variant="secondary">
            {h === "held" ? "Hold" : "Release"} {what}
          </SubmitButton>
        </ActionForm>
      ))}
    </div>
  );
}

export function DispositionForm(props: {
  ncId: string;
  itemId: string;
  label: string;
  recipes: Option[];
  letters: Option[];
}) {
  const [kind, setKind] = useState("");
  return (
    <ActionForm
      action={setDispositionAction}
      className="grid gap-2 sm:grid-cols-2"
      aria-label={`Disposition of ${props.label}`}
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <input type="hidden" name="itemId" value={props.itemId} />
      <SelectField
        name="disposition"
        label="Disposition"
        options={options(NC_DISPOSITIONS, NC_DISPOSITION_LABELS)}
        placeholder="Choose…"
        value={kind}
        onValueChange={setKind}
        dense
      />
      {kind === "reclean" && (
        <SelectField
          name="recleanRecipeId"
          label="Re-clean under recipe"
          options={props.recipes}
          placeholder="Choose…"
          dense
        />
      )}
      {kind === "use_as_is" && (
        <>
          <Field name="concessionReference" label="Concession reference" dense />
          <SelectField
            name="concessionFileId"
            label="Concession letter"
            options={props.letters}
            placeholder={props.letters.length ? "Choose…" : "Upload the letter below first"}
            dense
          />
        </>
      )}
      <Field name="note" label="Note (optional)" dense className="sm:col-span-2" />
      <div>
        <SubmitButton variant="secondary">Record disposition</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function RootCauseForm(props: {
  ncId: string;
  method: string | null;
  content: RichDoc | null;
}) {
  return (
    <ActionForm action={saveRootCauseAction} className="space-y-3" aria-label="Root cause">
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <ChoiceGroup
        type="radio"
        name="method"
        legend="Method"
        inline
        defaultValues={props.method ? [props.method] : []}
        options={options(NC_CAUSE_METHODS, NC_METHOD_LABELS)}
      />
      <RootCauseEditor name="content" initialContent={props.content} />
      <FieldError name="content" />
      <SubmitButton variant="secondary">Save the root cause</SubmitButton>
    </ActionForm>
  );
}

export function AddActionForm(props: { ncId: string; people: Option[]; today: string }) {
  return (
    <ActionForm
      action={addNcAction}
      resetOnSuccess
      className="grid gap-3 sm:grid-cols-2"
      aria-label="Add an action"
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <ChoiceGroup
        type="radio"
        name="kind"
        legend="Kind"
        inline
        defaultValues={["corrective"]}
        options={NC_ACTION_KINDS.map((k) => ({
          value: k,
          label: k === "corrective" ? "Corrective" : "Preventive",
        }))}
      />
      <Field name="description" label="What will be done" className="sm:col-span-2" />
      <SelectField
        name="ownerId"
        label="Action owner"
        options={props.people}
        placeholder="Choose…"
      />
      <DateField name="dueOn" label="Action due on" />
      <div className="sm:col-span-2">
        <SubmitButton variant="secondary">Add the action</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function UpdateActionForm(props: {
  ncId: string;
  actionId: string;
  label: string;
  status: string;
  evidenceLink: string | null;
}) {
  return (
    <ActionForm
      action={updateNcAction}
      className="flex flex-wrap items-end gap-2"
      aria-label={`Update ${props.label}`}
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <input type="hidden" name="actionId" value={props.actionId} />
      <SelectField
        name="status"
        label="Status"
        options={options(NC_ACTION_STATUSES, NC_ACTION_STATUS_LABELS)}
        defaultValue={props.status}
        dense
      />
      <Field
        name="evidenceLink"
        label="Evidence"
        defaultValue={props.evidenceLink ?? ""}
        hint="Run number, document or change request."
        dense
      />
      <SubmitButton variant="secondary">Save</SubmitButton>
    </ActionForm>
  );
}

export function OpenChangeFromActionForm(props: { ncId: string; actionId: string; label: string }) {
  return (
    <ActionForm
      action={openChangeFromActionAction}
      className="flex flex-wrap items-end gap-2"
      aria-label={`Change request for ${props.label}`}
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <input type="hidden" name="actionId" value={props.actionId} />
      <SelectField
        name="kind"
        label="The fix changes"
        options={NC_CHANGE_KINDS.map((k) => ({ value: k, label: CHANGE_KIND_LABELS[k] }))}
        defaultValue="parameter_change"
        dense
      />
      <SubmitButton variant="secondary">Open a change request</SubmitButton>
    </ActionForm>
  );
}

export function PlanEffectivenessForm(props: {
  ncId: string;
  criterion: string | null;
  dueOn: string | null;
}) {
  return (
    <ActionForm
      action={planEffectivenessAction}
      className="grid gap-3 sm:grid-cols-2"
      aria-label="Plan the effectiveness check"
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <TextareaField
        name="criterion"
        label="Criterion"
        defaultValue={props.criterion ?? ""}
        rows={2}
        className="sm:col-span-2"
        hint="What will show the actions worked, e.g. the next three verified runs pass."
      />
      <DateField name="dueOn" label="Check due on" defaultValue={props.dueOn ?? ""} />
      <div className="self-end">
        <SubmitButton variant="secondary">Save the plan</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function RecordEffectivenessForm(props: { ncId: string; files: Option[] }) {
  return (
    <ActionForm
      action={recordEffectivenessAction}
      className="grid gap-3 sm:grid-cols-2"
      aria-label="Record the effectiveness check"
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <ChoiceGroup
        type="radio"
        name="result"
        legend="Result"
        inline
        options={[
          { value: "confirmed", label: "Effective" },
          { value: "not_effective", label: "Not effective" },
        ]}
      />
      <Field
        name="evidenceRunNumber"
        label="Evidence run number"
        hint="A verified test run, e.g. TR-2026-031."
      />
      <SelectField
        name="evidenceFileId"
        label="Or evidence file"
        options={props.files}
        placeholder={props.files.length ? "None" : "Upload a file below first"}
      />
      <Field name="note" label="Note (optional)" className="sm:col-span-2" />
      <div className="sm:col-span-2">
        <SubmitButton>Record the result</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function AdvanceForm(props: { ncId: string; to: string; label: string }) {
  return (
    <ActionForm action={advanceNonconformanceAction} aria-label={props.label}>
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <input type="hidden" name="to" value={props.to} />
      <SubmitButton>{props.label}</SubmitButton>
    </ActionForm>
  );
}

export function CancelForm(props: { ncId: string }) {
  return (
    <ActionForm
      action={cancelNonconformanceAction}
      className="space-y-2"
      aria-label="Cancel the nonconformance"
    >
      <input type="hidden" name="nonconformanceId" value={props.ncId} />
      <TextareaField name="reason" label="Reason for cancelling" rows={2} />
      <SubmitButton variant="danger">Cancel the nonconformance</SubmitButton>
    </ActionForm>
  );
}

/** Uploads a concession letter or evidence file as soon as it is chosen, then shows it in the lists. */
export function NcFileUpload(props: { ncId: string }) {
  const router = useRouter();
  const [status, setStatus] = useState<{ error: boolean; text: string } | null>(null);
  async function upload(file: File | null) {
    setStatus(null);
    if (!file) return;
    setStatus({ error: false, text: `Uploading ${file.name}…` });
    const body = new FormData();
    body.set("file", file);
    try {
      const response = await fetch(`/api/nonconformances/${props.ncId}/files`, {
        method: "POST",
        body,
      });
      const json = (await response.json().catch(() => null)) as {
        ok?: boolean;
        message?: string;
      } | null;
      if (!response.ok || !json?.ok) {
        setStatus({
          error: true,
          text: json?.message ?? `The upload failed (HTTP ${response.status}).`,
        });
        return;
      }
      setStatus({ error: false, text: json.message ?? "Stored." });
      router.refresh();
    } catch {
      setStatus({ error: true, text: "The file did not reach the server." });
    }
  }
  return (
    <div className="space-y-1">
      <FileField
        label="Upload a file"
        accept=".pdf,.png,.jpg,.jpeg,.csv"
        hint="A customer's concession letter or the evidence of the effectiveness check; kept by its SHA-256 hash."
        onChange={(e) => void upload(e.target.files?.[0] ?? null)}
      />
      {status && (
        <p
          role={status.error ? "alert" : "status"}
          className={`text-sm ${status.error ? "text-red-800" : "text-stone-700"}`}
        >
          {status.text}
        </p>
      )}
    </div>
  );
}
