import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { NcTable } from "@/components/nonconformances/nc-table";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { PageHeader } from "@/components/ui/page-header";
import { NC_SEVERITIES, NC_SOURCE_KINDS, NC_STATUSES } from "@/db/enums";
import { can } from "@/lib/auth/permissions";
import {
  NC_SEVERITY_LABELS,
  NC_SOURCE_LABELS,
  NC_STATUS_LABELS,
} from "@/lib/nonconformances/lifecycle";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listNonconformances } from "@/lib/server/nonconformances/queries";
import { fromPageParams, readListParams, rowMatches } from "@/lib/url/list-params";

/** The list's filters live in the address, so a filtered list can be linked and reloaded. */
const FILTERS = { status: "", severity: "", source: "", q: "" };

export const metadata: Metadata = { title: "Nonconformances" };

export default async function NonconformancesPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("nc.view");
  const filters = readListParams(fromPageParams(await searchParams), FILTERS);
  const all = await listNonconformances();
  const rows = all.filter((r) =>
    rowMatches({
      equals: {
        status: { want: filters.status, have: r.status },
        severity: { want: filters.severity, have: r.severity },
        source: { want: filters.source, have: r.sourceKind },
      },
      q: filters.q,
      text: [
        r.number,
        r.title,
        r.sourceLabel,
        r.recipeCode ?? "",
        r.familyCode ?? "",
        r.owner ?? "",
      ],
    }),
  );
  return (
    <>
      <PageHeader
        title="Nonconformances"
        description="Failed results and reported problems, from containment to a signed closure."
        actions={
          can(user.roles, "nc.open") ? (
            <IntentLink
              href="/nonconformances/new"
              className="rounded-md bg-brand-700 px-3 py-2 text-sm font-medium text-white hover:bg-brand-800"
            >
              Report a nonconformance
            </IntentLink>
          ) : undefined
        }
      />
      <ListFilterForm
        label="Filter nonconformances"
        action="/nonconformances"
        filters={[
          {
            name: "status",
            label: "Status",
            value: filters.status,
            options: NC_STATUSES.map((s) => ({ value: s, label: NC_STATUS_LABELS[s] })),
          },
          {
            name: "severity",
            label: "Severity",
            value: filters.severity,
            options: NC_SEVERITIES.map((s) => ({ value: s, label: NC_SEVERITY_LABELS[s] })),
          },
          {
            name: "source",
            label: "Source",
            value: filters.source,
            options: NC_SOURCE_KINDS.map((s) => ({ value: s, label: NC_SOURCE_LABELS[s] })),
          },
          { name: "q", label: "Number, title, reference, recipe or owner", value: filters.q },
        ]}
      />
      <NcTable
        rows={rows}
        caption="Nonconformances"
        empty={all.length ? "No nonconformances match these filters." : "No nonconformances yet."}
      />
    </>
  );
}
