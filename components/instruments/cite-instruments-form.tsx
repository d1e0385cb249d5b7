"use client";

import { citeInstrumentsAction } from "@/app/(app)/evidence/runs/[runId]/actions";
import { ActionForm } from "@/components/ui/action-form";
import { ChoiceGroup } from "@/components/ui/field";
import { SubmitButton } from "@/components/ui/submit-button";

/** Ticks the instruments an open run used; saving replaces the run's list. */
export function CiteInstrumentsForm({
  runId,
  options,
  cited,
}: {
  runId: string;
  options: { value: string; label: string }[];
  cited: string[];
}) {
  return (
    <ActionForm action={citeInstrumentsAction} className="space-y-3" aria-label="Instruments used">
      <input type="hidden" name="runId" value={runId} />
      <ChoiceGroup
        type="checkbox"
        name="instrumentIds"
        legend="Instruments used"
        options={options}
        defaultValues={cited}
        hint="Only instruments in service can be cited. One past its calibration due date stops the run being signed as performed."
      />
      <SubmitButton variant="secondary">Save the instruments used</SubmitButton>
    </ActionForm>
  );
}
