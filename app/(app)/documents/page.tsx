import type { Metadata } from "next";
import Link from "next/link";
import { StatusBadge } from "@/components/documents/status-badge";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listDocuments } from "@/lib/server/documents/queries";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Documents" };

export default async function DocumentsPage() {
  const user = await requirePageUser("documents.view");
  const rows = await listDocuments();
  const mayDraft = can(user.roles, "document.draft");
  return (
    <>
      <PageHeader
        title="Documents"
        description="Validation protocols (IQ, OQ, PQ), validation reports and procedures, with their versions and signatures."
        actions={
          mayDraft && (
            <Link href="/documents/new" className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800">
              New document
            </Link>
          )
        }
      />
      {rows.length === 0 ? (
        <EmptyState title="No documents yet">
          Controlled documents are listed here with their number, version, status and effective date once an engineer drafts the first protocol.
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
                  <Link href={`/documents/${d.id}`} className="font-medium text-brand-800 hover:underline">
                    {d.number}
                  </Link>
                </Td>
                <Td>{d.title}</Td>
                <Td className="whitespace-nowrap">{TYPE_LABELS[d.type]}</Td>
                <Td className="whitespace-nowrap">
                  v{d.latest.version} <StatusBadge status={d.latest.status} />
                </Td>
                <Td className="whitespace-nowrap">{d.effective ? `v${d.effective.version} since ${d.effective.effectiveDate}` : "None"}</Td>
                <Td>{d.owner}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
      )}
    </>
  );
}
