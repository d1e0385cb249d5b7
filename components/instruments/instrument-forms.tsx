"use client";

import { useState } from "react";
import {
  createInstrumentAction,
  recordCalibrationAction,
  retireInstrumentAction,
  updateInstrumentAction,
} from "@/app/(app)/instruments/actions";
import { ActionForm } from "@/components/ui/action-form";
import {
  ChoiceGroup,
  DateField,
  Field,
  NumberField,
  SelectField,
  TextareaField,
} from "@/components/ui/field";
import { StoredFileUpload } from "@/components/ui/stored-file-upload";
import { SubmitButton } from "@/components/ui/submit-button";
import type { Instrument } from "@/db/schema";
import {
  CALIBRATION_PERFORMER_LABELS,
  CALIBRATION_PERFORMERS,
  CALIBRATION_RESULT_LABELS,
  CALIBRATION_RESULTS,
  INSTRUMENT_KIND_LABELS,
  INSTRUMENT_KINDS,
} from "@/lib/instruments/kinds";

const KIND_OPTIONS = INSTRUMENT_KINDS.map((k) => ({ value: k, label: INSTRUMENT_KIND_LABELS[k] }));

/** The register fields shared by the new and edit forms; a test-ink set asks for its expiry instead of an interval. */
function RegisterFields({ initial }: { initial?: Instrument }) {
  const [kind, setKind] = useState<string>(initial?.kind ?? "");
  const ink = kind === "test_ink_set";
  return (
    <>
      <Field
        name="assetNumber"
        label="Asset number"
        defaultValue={initial?.assetNumber}
        hint="As on the instrument's label, e.g. BAL-02."
      />
      <SelectField
        name="kind"
        label="Kind"
        options={KIND_OPTIONS}
        placeholder="Choose…"
        value={kind}
        onValueChange={setKind}
      />
      <Field
        name="description"
        label="Description"
        defaultValue={initial?.description}
        className="sm:col-span-2"
      />
      <Field name="location" label="Location" defaultValue={initial?.location} />
      <Field
        name="range"
        label="Range (optional)"
        defaultValue={initial?.range ?? ""}
        hint="With its unit, e.g. 0–220 g or 30–72 mN/m."
      />
      <Field
        name="resolution"
        label="Resolution (optional)"
        defaultValue={initial?.resolution ?? ""}
        hint="With its unit, e.g. 0.01 mg."
      />
      {ink ? (
        <DateField
          name="expiresOn"
          label="Expiry date"
          defaultValue={initial?.expiresOn ?? ""}
          hint="The ink set may be used up to and including this day."
        />
      ) : (
        <NumberField
          name="calibrationIntervalMonths"
          label="Calibration interval"
          unit="months"
          integer
          defaultValue={initial?.calibrationIntervalMonths?.toString() ?? ""}
          hint="The next calibration is due this many months after each one."
        />
      )}
    </>
  );
}

export function NewInstrumentForm() {
  return (
    <ActionForm
      action={createInstrumentAction}
      className="grid gap-4 sm:grid-cols-2"
      aria-label="Register an instrument"
    >
      <RegisterFields />
      <div className="sm:col-span-2">
        <SubmitButton>Register the instrument</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function EditInstrumentForm({ instrument }: { instrument: Instrument }) {
  return (
    <ActionForm
      action={updateInstrumentAction}
      className="grid gap-4 sm:grid-cols-2"
      aria-label="Edit the instrument"
    >
      <input type="hidden" name="instrumentId" value={instrument.id} />
      <RegisterFields initial={instrument} />
      <ChoiceGroup
        type="radio"
        name="status"
        legend="Status"
        inline
        options={[
          { value: "in_service", label: "In service" },
          { value: "out_of_service", label: "Out of service" },
        ]}
        defaultValues={[instrument.status === "out_of_service" ? "out_of_service" : "in_service"]}
      />
      <Field
        name="statusReason"
        label="Why out of service"
        defaultValue={instrument.statusReason ?? ""}
        hint="Needed when it is out of service; cleared when it returns."
      />
      <div className="sm:col-span-2">
        <SubmitButton>Save changes</SubmitButton>
      </div>
    </ActionForm>
  );
}

export function RetireInstrumentForm({ instrumentId }: { instrumentId: string }) {
  return (
    <ActionForm
      action={retireInstrumentAction}
      className="space-y-3"
      aria-label="Retire the instrument"
    >
      <input type="hidden" name="instrumentId" value={instrumentId} />
      <TextareaField
        name="reason"
        label="Reason for retiring"
        rows={2}
        hint="Retiring is final: the instrument can no longer be cited or calibrated."
      />
      <SubmitButton variant="secondary">Retire</SubmitButton>
    </ActionForm>
  );
}

export function CalibrationForm({
  instrumentId,
  today,
  intervalMonths,
}: {
  instrumentId: string;
  today: string;
  intervalMonths: number | null;
}) {
  return (
    <ActionForm
      action={recordCalibrationAction}
      resetOnSuccess
      className="grid gap-4 sm:grid-cols-2"
      aria-label="Record a calibration"
    >
      <input type="hidden" name="instrumentId" value={instrumentId} />
      <DateField name="calibratedOn" label="Calibrated on" defaultValue={today} />
      <DateField
        name="dueOn"
        label="Next due (optional)"
        hint={
          intervalMonths
            ? `Left empty, ${intervalMonths} months after the calibration date.`
            : "The date the next calibration is due."
        }
      />
      <ChoiceGroup
        type="radio"
        name="performer"
        legend="Calibrated by"
        inline
        options={CALIBRATION_PERFORMERS.map((p) => ({
          value: p,
          label: CALIBRATION_PERFORMER_LABELS[p],
        }))}
      />
      <Field name="performedBy" label="Person or calibration lab" />
      <SelectField
        name="result"
        label="Result as found"
        placeholder="Choose…"
        options={CALIBRATION_RESULTS.map((r) => ({
          value: r,
          label: CALIBRATION_RESULT_LABELS[r],
        }))}
        hint="Out of tolerance as found opens a nonconformance on the runs that used it."
      />
      <Field name="certificateNumber" label="Certificate number (optional)" />
      <div className="sm:col-span-2">
        <StoredFileUpload
          endpoint="/api/instruments/certificates"
          name="certificateFileId"
          label="Certificate (optional)"
          accept=".pdf,.png,.jpg,.jpeg"
          hint="PDF or image; stored by its SHA-256 hash and downloadable from this page."
          what="certificate"
        />
      </div>
      <TextareaField name="note" label="Note (optional)" rows={2} className="sm:col-span-2" />
      <div className="sm:col-span-2">
        <SubmitButton>Record the calibration</SubmitButton>
      </div>
    </ActionForm>
  );
}
