import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { ImpactWord } from "@/components/changes/diff-view";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { CHANGE_KIND_LABELS, CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { hasChangeRequests, listChangeRequests } from "@/lib/server/changes/queries";
import { PageNav } from "@/components/ui/page-nav";
import { EmergencyBadge } from "@/components/changes/change-types-panels";
import { showsEmergency } from "@/lib/changes/emergency";
import type { ChangeStatus } from "@/lib/changes/workflow";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { CHANGE_KINDS, CHANGE_STATUSES } from "@/db/enums";
import { fromPageParams, listSearch, readListParams } from "@/lib/url/list-params";

/** The list's filters and page, read from the address so a filtered list can be linked and reloaded. */
const FILTERS = { status: "", kind: "", q: "", page: "1" };

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
  const [list, any] = await Promise.all([
    listChangeRequests({ ...filters, page: Number.parseInt(filters.page, 10) || 1 }),
    hasChangeRequests(),
  ]);
  const rows = list.rows;
  const pageHref = (page: number) =>
    `/changes${listSearch({ ...filters, page: String(page) }, FILTERS)}`;
  return (
    <>
      <PageHeader
        title="Changes"
        description="Change requests against effective recipe versions: parameter diff, computed impact, approval and requalification."
      />
      {any && (
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
      {any && rows.length === 0 ? (
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
      {rows.length > 0 && (
        <PageNav
          label="Pages of the change list"
          page={list.page}
          pages={list.pages}
          summary={`${list.total.toLocaleString("en")} change request${list.total === 1 ? "" : "s"}`}
          href={pageHref}
        />
      )}
    </>
  );
}
