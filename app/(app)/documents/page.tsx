import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { StatusBadge } from "@/components/documents/status-badge";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { DOCUMENT_STATUS_LABELS, TYPE_LABELS } from "@/lib/documents/lifecycle";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { hasDocuments, listDocuments } from "@/lib/server/documents/queries";
import { PageNav } from "@/components/ui/page-nav";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { DOCUMENT_STATUSES, DOCUMENT_TYPES } from "@/db/enums";
import { fromPageParams, listSearch, readListParams } from "@/lib/url/list-params";

/** The list's filters and page, read from the address so a filtered list can be linked and reloaded. */
const FILTERS = { type: "", status: "", q: "", page: "1" };

export const metadata: Metadata = { title: "Documents" };

export default async function DocumentsPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("documents.view");
  const filters = readListParams(fromPageParams(await searchParams), FILTERS);
  const [list, any] = await Promise.all([
    listDocuments({ ...filters, page: Number.parseInt(filters.page, 10) || 1 }),
    hasDocuments(),
  ]);
  const rows = list.rows;
  const pageHref = (page: number) =>
    `/documents${listSearch({ ...filters, page: String(page) }, FILTERS)}`;
  const mayDraft = can(user.roles, "document.draft");
  return (
    <>
      <PageHeader
        title="Documents"
        description="Validation protocols (IQ, OQ, PQ), validation reports and procedures, with their versions and signatures."
        actions={
          mayDraft && (
            <IntentLink
              href="/documents/new"
              className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800"
            >
              New document
            </IntentLink>
          )
        }
      />
      {any && (
        <ListFilterForm
          label="Filter documents"
          action="/documents"
          filters={[
            {
              name: "type",
              label: "Type",
              value: filters.type,
              options: DOCUMENT_TYPES.map((t) => ({ value: t, label: TYPE_LABELS[t] })),
            },
            {
              name: "status",
              label: "Latest version",
              value: filters.status,
              options: DOCUMENT_STATUSES.map((s) => ({
                value: s,
                label: DOCUMENT_STATUS_LABELS[s],
              })),
            },
            { name: "q", label: "Number, title or owner", value: filters.q },
          ]}
        />
      )}
      {any && rows.length === 0 ? (
        <p className="text-sm text-stone-600">No documents match these filters.</p>
      ) : rows.length === 0 ? (
        <EmptyState title="No documents yet">
          Controlled documents are listed here with their number, version, status and effective date
          once an engineer drafts the first protocol.
        </EmptyState>
      ) : (
        <Table caption="Controlled documents">
          <THead>
            <Th>Number</Th>
            <Th>Title</Th>
            <Th>Type</Th>
            <Th>Latest version</Th>
            <Th>In force</Th>
            <Th>Owner</Th>
          </THead>
          <TBody>
            {rows.map((d) => (
              <tr key={d.id}>
                <Td className="font-mono text-xs whitespace-nowrap">
                  <IntentLink
                    href={`/documents/${d.id}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    {d.number}
                  </IntentLink>
                </Td>
                <Td>{d.title}</Td>
                <Td className="whitespace-nowrap">{TYPE_LABELS[d.type]}</Td>
                <Td className="whitespace-nowrap">
                  v{d.latest.version} <StatusBadge status={d.latest.status} />
                </Td>
                <Td className="whitespace-nowrap">
                  {d.effective
                    ? `v${d.effective.version} since ${d.effective.effectiveDate}`
                    : "None"}
                </Td>
                <Td>{d.owner}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
      {rows.length > 0 && (
        <PageNav
          label="Pages of the document list"
          page={list.page}
          pages={list.pages}
          summary={`${list.total.toLocaleString("en")} document${list.total === 1 ? "" : "s"}`}
          href={pageHref}
        />
      )}
    </>
  );
}
