import type { Metadata } from "next";
import { DeviationForm } from "@/components/deviations/deviation-form";
import { PageHeader } from "@/components/ui/page-header";
import { todayUtc } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { deviationFormOptions } from "@/lib/server/deviations/queries";
import { createDeviationAction } from "../actions";

export const metadata: Metadata = { title: "New deviation" };

export default async function NewDeviationPage() {
  await requirePageUser("deviation.draft");
  const options = await deviationFormOptions();
  return (
    <>
      <PageHeader
        title="New deviation"
        description="Say what may run outside its validated range, for which parts, why, at what risk and until when. You sign it as author next; an approver makes it active."
      />
      <DeviationForm
        action={createDeviationAction}
        recipes={options.recipes}
        families={options.families}
        today={todayUtc()}
      />
    </>
  );
}
