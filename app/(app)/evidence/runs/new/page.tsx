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
  const query = await searchParams;
  const allVersions = query.versions === "all";
  const options = await runFormOptions(allVersions ? "all" : "current");
  const defaults = runDefaultsFromQuery(query, options.changes, options);
  // The switch between current and all versions keeps what the address fills in (a change's gate).
  const switched = new URLSearchParams(
    Object.entries(query).filter(
      (e): e is [string, string] => typeof e[1] === "string" && e[0] !== "versions",
    ),
  );
  if (!allVersions) switched.set("versions", "all");
  const switchHref = `/evidence/runs/new${switched.size ? `?${switched}` : ""}`;
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
        versions={{ all: allVersions, switchHref }}
        defaultTechnicianId={
          options.technicians.some((t) => t.id === user.id) ? user.id : undefined
        }
      />
    </>
  );
}
