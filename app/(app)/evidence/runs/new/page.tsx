import type { Metadata } from "next";
import { RunForm } from "@/components/evidence/run-form";
import { PageHeader } from "@/components/ui/page-header";
import { runDefaultsFromQuery } from "@/lib/evidence/run-defaults";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { runFormOptions } from "@/lib/server/evidence/queries";
import { createRunAction } from "../../actions";

export const metadata: Metadata = { title: "New test run" };

export default async function NewRunPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("evidence.record");
  const options = await runFormOptions();
  const defaults = runDefaultsFromQuery(await searchParams, options.changes, options);
  return (
    <>
      <PageHeader
        title="New test run"
        description="Which parts, washed with which recipe version, tested how, by whom and where. Samples are entered on the next page."
      />
      <RunForm
        action={createRunAction}
        options={options}
        defaults={defaults}
        defaultTechnicianId={
          options.technicians.some((t) => t.id === user.id) ? user.id : undefined
        }
      />
    </>
  );
}
