import type { Metadata } from "next";
import Link from "next/link";
import { ImpactWord } from "@/components/changes/diff-view";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { CHANGE_KIND_LABELS, STATUS_LABELS } from "@/lib/recipes/change-workflow";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listChangeRequests } from "@/lib/server/changes/queries";
import { formatDate } from "@/lib/format/date";

export const metadata: Metadata = { title: "Changes" };

export default async function ChangesPage() {
  await requirePageUser("changes.view");
  const rows = await listChangeRequests();
  return (
    <>
      <PageHeader title="Changes" description="Change requests against effective recipe versions: parameter diff, computed impact, approval and requalification." />
      {rows.length === 0 ? (
        <EmptyState title="No change requests yet">
          An engineer opens a change request from a recipe&apos;s effective version under <Link href="/systems" className="text-brand-800 underline">Cleaning systems</Link>.
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm">
            <caption className="sr-only">Change requests</caption>
            <thead className="bg-stone-50 text-left text-xs text-stone-500 uppercase">
              <tr>
                <th className="px-3 py-2 font-medium">Number</th>
                <th className="px-3 py-2 font-medium">Title</th>
                <th className="px-3 py-2 font-medium">Recipe</th>
                <th className="px-3 py-2 font-medium">Kind</th>
                <th className="px-3 py-2 font-medium">Impact</th>
                <th className="px-3 py-2 font-medium">Status</th>
                <th className="px-3 py-2 font-medium">Opened</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-stone-100">
              {rows.map((r) => (
                <tr key={r.id}>
                  <td className="px-3 py-2 whitespace-nowrap">
                    <Link href={`/changes/${r.id}`} className="font-medium text-brand-800 hover:underline">
                      {r.number}
                    </Link>
                  </td>
                  <td className="px-3 py-2">{r.title}</td>
                  <td className="px-3 py-2 whitespace-nowrap">{r.recipeCode}</td>
                  <td className="px-3 py-2">{CHANGE_KIND_LABELS[r.kind]}</td>
                  <td className="px-3 py-2">
                    <ImpactWord impact={r.impact} />
                  </td>
                  <td className="px-3 py-2">{STATUS_LABELS[r.status]}</td>
                  <td className="px-3 py-2 whitespace-nowrap tabular-nums">
                    {formatDate(r.createdAt)} · {r.author}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
