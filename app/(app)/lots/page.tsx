import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { formatDateTime } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { findLots } from "@/lib/server/cycles/queries";

export const metadata: Metadata = { title: "Lots" };

export default async function LotsPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  await requirePageUser("evidence.view");
  const sp = await searchParams;
  const q = typeof sp.q === "string" ? sp.q.trim().slice(0, 60) : "";
  const lots = await findLots(q);
  return (
    <>
      <PageHeader
        title="Lots"
        description="Find a lot by the start of its number: its history shows every cycle that washed it, the recipe version and the bath at the time, and the tests of its parts."
      />
      <ListFilterForm
        label="Find a lot"
        action="/lots"
        filters={[{ name: "q", label: "Lot number starts with", value: q }]}
      />
      <Table caption={q ? `Lots starting with ${q}` : "Lots of the latest cycles"}>
        <THead>
          <Th>Lot</Th>
          <Th align="right">Cycles</Th>
          <Th>First cycle</Th>
          <Th>Last cycle</Th>
          <Th>Flag</Th>
        </THead>
        <TBody>
          {lots.length === 0 && <EmptyRow colSpan={5}>No lot matches.</EmptyRow>}
          {lots.map((l) => (
            <tr key={l.lot}>
              <Td>
                <IntentLink
                  href={`/lots/${encodeURIComponent(l.lot)}`}
                  className="font-medium text-brand-800 hover:underline"
                >
                  {l.lot}
                </IntentLink>
              </Td>
              <Td numeric>{l.cycles}</Td>
              <Td>{formatDateTime(l.firstStart)}</Td>
              <Td>{formatDateTime(l.lastStart)}</Td>
              <Td>{l.flagged > 0 ? <strong>{l.flagged} flagged</strong> : "In range"}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
