import type { Metadata } from "next";
import Link from "next/link";
import { StatusBadge } from "@/components/documents/status-badge";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { TYPE_LABELS } from "@/lib/documents/lifecycle";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listDocuments } from "@/lib/server/documents/queries";

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
        <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm">
            <caption className="sr-only">Controlled documents</caption>
            <thead className="bg-stone-50 text-left text-xs text-stone-500 uppercase">
              <tr>
                <th className="px-3 py-2 font-medium">Number</th>
                <th className="px-3 py-2 font-medium">Title</th>
                <th className="px-3 py-2 font-medium">Type</th>
                <th className="px-3 py-2 font-medium">Latest version</th>
                <th className="px-3 py-2 font-medium">In force</th>
                <th className="px-3 py-2 font-medium">Owner</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-stone-100">
              {rows.map((d) => (
                <tr key={d.id}>
                  <td className="px-3 py-2 font-mono text-xs whitespace-nowrap">
                    <Link href={`/documents/${d.id}`} className="font-medium text-brand-800 hover:underline">
                      {d.number}
                    </Link>
                  </td>
                  <td className="px-3 py-2">{d.title}</td>
                  <td className="px-3 py-2 whitespace-nowrap">{TYPE_LABELS[d.type]}</td>
                  <td className="px-3 py-2 whitespace-nowrap">
                    v{d.latest.version} <StatusBadge status={d.latest.status} />
                  </td>
                  <td className="px-3 py-2 whitespace-nowrap">{d.effective ? `v${d.effective.version} since ${d.effective.effectiveDate}` : "None"}</td>
                  <td className="px-3 py-2">{d.owner}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
