import type { Metadata } from "next";
import { ControlPlanForm } from "@/components/control-plans/control-plan-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { controlPlanFormOptions } from "@/lib/server/control-plans/queries";
import { createControlPlanAction } from "../actions";

export const metadata: Metadata = { title: "New control plan" };

export default async function NewControlPlanPage() {
  await requirePageUser("control_plan.draft");
  const options = await controlPlanFormOptions();
  return (
    <>
      <PageHeader
        title="New control plan"
        description="Choose the qualified combination, then one line per routine test. You sign it as author next; a reviewer and an approver sign after you, and the approval puts it in force."
      />
      <ControlPlanForm
        action={createControlPlanAction}
        label="New control plan"
        combinations={options.combinations}
        tanks={options.tanks}
        submitLabel="Save draft"
      />
    </>
  );
}
