import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { ImpactWord } from "@/components/changes/diff-view";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { CHANGE_KIND_LABELS, CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listChangeRequests } from "@/lib/server/changes/queries";
import { EmergencyBadge } from "@/components/changes/change-types-panels";
import { showsEmergency } from "@/lib/changes/emergency";
import type { ChangeStatus } from "@/lib/changes/workflow";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { CHANGE_KINDS, CHANGE_STATUSES } from "@/db/enums";
import { fromPageParams, readListParams, rowMatches } from "@/lib/url/list-params";

/** The list's filters, read from the address so a filtered list can be linked and reloaded. */
const FILTERS = { status: "", kind: "", q: "" };

export const metadata: Metadata = { title: "Changes" };

const emergencyShown = (r: { emergencyAt: string | null; status: ChangeStatus }) =>
  r.emergencyAt !== null && showsEmergency(r.status);

export default async function ChangesPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  await requirePageUser("changes.view");
  const filters = readListParams(fromPageParams(await searchParams), FILTERS);
  const all = await listChangeRequests();
  const rows = all.filter((r) =>
    rowMatches({
      equals: {
        status: { want: filters.status, have: r.status },
        kind: { want: filters.kind, have: r.kind },
      },
      q: filters.q,
      text: [r.number, r.title, r.recipeCode, r.author, emergencyShown(r) ? "Emergency" : ""],
    }),
  );
  return (
    <>
      <PageHeader
        title="Changes"
        description="Change requests against effective recipe versions: parameter diff, computed impact, approval and requalification."
      />
      {all.length > 0 && (
        <ListFilterForm
          label="Filter change requests"
          action="/changes"
          filters={[
            {
              name: "status",
              label: "Status",
              value: filters.status,
              options: CHANGE_STATUSES.map((s) => ({ value: s, label: CHANGE_STATUS_LABELS[s] })),
            },
            {
              name: "kind",
              label: "Kind",
              value: filters.kind,
              options: CHANGE_KINDS.map((k) => ({ value: k, label: CHANGE_KIND_LABELS[k] })),
            },
            { name: "q", label: "Number, title, recipe or author", value: filters.q },
          ]}
        />
      )}
      {all.length > 0 && rows.length === 0 ? (
        <p className="text-sm text-stone-600">No change requests match these filters.</p>
      ) : rows.length === 0 ? (
        <EmptyState title="No change requests yet">
          An engineer opens a change request from a recipe&apos;s effective version under{" "}
          <IntentLink href="/systems" className="text-brand-800 underline">
            Cleaning systems
          </IntentLink>
          .
        </EmptyState>
      ) : (
        <Table caption="Change requests">
          <THead>
            <Th>Number</Th>
            <Th>Title</Th>
            <Th>Recipe</Th>
            <Th>Kind</Th>
            <Th>Impact</Th>
            <Th>Status</Th>
            <Th>Opened</Th>
          </THead>
          <TBody>
            {rows.map((r) => (
              <tr key={r.id}>
                <Td className="whitespace-nowrap">
                  <IntentLink
                    href={`/changes/${r.id}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    {r.number}
                  </IntentLink>
                </Td>
                <Td>
                  {r.title}
                  {emergencyShown(r) && <EmergencyBadge />}
                </Td>
                <Td className="whitespace-nowrap">{r.recipeCode}</Td>
                <Td>{CHANGE_KIND_LABELS[r.kind]}</Td>
                <Td>
                  <ImpactWord impact={r.impact} />
                </Td>
                <Td>{CHANGE_STATUS_LABELS[r.status]}</Td>
                <Td className="whitespace-nowrap tabular-nums">
                  {formatDate(r.createdAt)} · {r.author}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
    </>
  );
}
