import type { Metadata } from "next";
import { getDb } from "@/db/client";
import { ActionForm } from "@/components/ui/action-form";
import { NumberField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { SubmitButton } from "@/components/ui/submit-button";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getChangeControlSettings } from "@/lib/server/changes/settings";
import { saveChangeControlSettingsAction } from "./actions";

export const metadata: Metadata = { title: "Admin · Change control" };

export default async function ChangeControlSettingsPage() {
  await requirePageUser("matrix.manage");
  const settings = await getChangeControlSettings(getDb());
  return (
    <>
      <PageHeader
        title="Change control settings"
        description="How long an emergency change may stay in force before approval, and how many verified runs on a new version must pass after a change is closed."
      />
      <ActionForm
        action={saveChangeControlSettingsAction}
        aria-label="Change control settings"
        className="max-w-lg space-y-4 rounded-lg border border-stone-200 bg-white p-5"
      >
        <NumberField
          integer
          name="emergencyApprovalDays"
          label="Emergency approval within"
          unit="days"
          defaultValue={String(settings.emergencyApprovalDays)}
          hint="An emergency change is escalated to approvers and administrators when no approver has signed by then."
        />
        <NumberField
          integer
          name="effectivenessRuns"
          label="Effectiveness check"
          unit="verified runs"
          defaultValue={String(settings.effectivenessRuns)}
          hint="After closure, this many runs verified on the new version must pass."
        />
        <SubmitButton>Save settings</SubmitButton>
      </ActionForm>
    </>
  );
}
