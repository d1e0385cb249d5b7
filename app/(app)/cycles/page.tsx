import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDateTime } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listCycles } from "@/lib/server/cycles/queries";

export const metadata: Metadata = { title: "Wash cycles" };

const button =
  "rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800";
const secondary =
  "rounded-md border border-stone-300 bg-white px-3.5 py-2 text-sm font-medium text-stone-800 hover:bg-stone-50";

export default async function CyclesPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("evidence.view");
  const sp = await searchParams;
  const one = (v: string | string[] | undefined) => (typeof v === "string" ? v.trim() : "");
  const flagged = one(sp.flagged) === "true" ? "true" : "";
  const system = one(sp.system).slice(0, 60);
  const { data } = await listCycles({
    limit: 100,
    flagged: flagged ? "true" : undefined,
    system: system || undefined,
  });
  return (
    <>
      <PageHeader
        title="Wash cycles"
        description="Every cycle a washer ran: the recipe version in force at its start, the part family and lots it washed, and the values it held. A value outside its validated range flags the cycle."
        actions={
          <>
            <IntentLink href="/lots" className={secondary}>
              Lot history
            </IntentLink>
            {can(user.roles, "evidence.record") && (
              <>
                <IntentLink href="/cycles/import" className={secondary}>
                  Import a cycle log
                </IntentLink>
                <IntentLink href="/cycles/new" className={button}>
                  Record a cycle
                </IntentLink>
              </>
            )}
          </>
        }
      />
      <ListFilterForm
        label="Filter cycles"
        action="/cycles"
        filters={[
          { name: "system", label: "Washer (code)", value: system },
          {
            name: "flagged",
            label: "Flag",
            value: flagged,
            options: [{ value: "true", label: "Flagged only" }],
          },
        ]}
      />
      <Table caption="Latest wash cycles">
        <THead>
          <Th>Cycle</Th>
          <Th>Started</Th>
          <Th>Recipe</Th>
          <Th>Part family</Th>
          <Th>Lots</Th>
          <Th>Flag</Th>
        </THead>
        <TBody>
          {data.length === 0 && <EmptyRow colSpan={6}>No cycle matches.</EmptyRow>}
          {data.map((c) => (
            <tr key={c.id}>
              <Td>
                <span className="font-medium">{c.cycleNumber}</span>
                <span className="block text-xs text-stone-600">{c.system}</span>
              </Td>
              <Td>{formatDateTime(c.startedAt)}</Td>
              <Td>
                {c.recipe} v{c.version}
              </Td>
              <Td>{c.partFamily}</Td>
              <Td>
                {c.lots.map((lot) => (
                  <IntentLink
                    key={lot}
                    href={`/lots/${encodeURIComponent(lot)}`}
                    className="mr-2 text-brand-800 hover:underline"
                  >
                    {lot}
                  </IntentLink>
                ))}
              </Td>
              <Td>
                {c.flagged ? (
                  <>
                    <strong>Flagged</strong>
                    <span className="block text-xs text-stone-700">{c.flagReasons.join(" ")}</span>
                  </>
                ) : (
                  "In range"
                )}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
