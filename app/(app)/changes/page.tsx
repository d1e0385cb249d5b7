import type { Metadata } from "next";
import Link from "next/link";
import { ImpactWord } from "@/components/changes/diff-view";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { CHANGE_KIND_LABELS, CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listChangeRequests } from "@/lib/server/changes/queries";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

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
                  <Link href={`/changes/${r.id}`} className="font-medium text-brand-800 hover:underline">
                    {r.number}
                  </Link>
                </Td>
                <Td>{r.title}</Td>
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
