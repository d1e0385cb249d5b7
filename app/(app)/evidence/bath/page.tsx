import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { Caution } from "@/components/ui/caution";
import { PageHeader } from "@/components/ui/page-header";
import { MAINTENANCE_LABELS, STATE_LABELS } from "@/lib/evidence/maintenance";
import { requirePageUser } from "@/lib/server/auth/current-user";
import {
  latestGradedByTank,
  listDetergents,
  listMaintenance,
  listTanks,
} from "@/lib/server/bath/queries";
import { LIMIT_STATE_LABELS } from "@/lib/bath/limits";
import { DetergentForm } from "@/components/evidence/bath-forms";
import { can } from "@/lib/auth/permissions";
import { saveDetergentAction } from "./actions";
import { formatDate } from "@/lib/format/date";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Bath and filter log" };

export default async function BathIndexPage() {
  const user = await requirePageUser("evidence.view");
  const [tanks, maintenance, detergents, latest] = await Promise.all([
    listTanks(),
    listMaintenance(),
    listDetergents(),
    latestGradedByTank(),
  ]);
  return (
    <>
      <PageHeader
        title="Bath and filter log"
        description="Bath changes, filter changes and bath readings per tank, with the maintenance intervals that fall due."
      />
      <div className="mb-6">
        <Caution title="hot, alkaline baths and filter changes">
          Isolate and lock out the machine before opening a filter housing or a tank. Wash baths run
          hot and alkaline: wear the protective equipment the site&apos;s procedures require.
        </Caution>
      </div>
      <Table caption="Tanks and their maintenance">
        <THead>
          <Th>Tank</Th>
          <Th>Maintenance</Th>
          <Th>Latest graded reading</Th>
        </THead>
        <TBody>
          {tanks.map(({ stage, system }) => {
            const items = maintenance.filter((m) => m.stageId === stage.id);
            return (
              <tr key={stage.id}>
                <Td>
                  <IntentLink
                    href={`/evidence/bath/${stage.id}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    {system.code} · {stage.name}
                  </IntentLink>
                  {stage.tankVolumeL !== null && (
                    <span className="block text-xs text-stone-600">{stage.tankVolumeL} L</span>
                  )}
                </Td>
                <Td>
                  {items.length === 0
                    ? "No interval set"
                    : items.map((m) => (
                        <span key={m.intervalId} className="block">
                          {MAINTENANCE_LABELS[m.kind]}:{" "}
                          <strong>{STATE_LABELS[m.status.state]}</strong> — due{" "}
                          {formatDate(m.status.dueAt)}
                        </span>
                      ))}
                </Td>
                <Td>
                  {latest.get(stage.id) ? (
                    <>
                      <strong>{LIMIT_STATE_LABELS[latest.get(stage.id)!.limitState!]}</strong>
                      <span className="block text-xs text-stone-600">
                        {formatDate(latest.get(stage.id)!.performedAt)}
                        {latest.get(stage.id)!.limitFindings
                          ? ` · ${latest.get(stage.id)!.limitFindings}`
                          : ""}
                      </span>
                    </>
                  ) : (
                    "No plan or no graded reading"
                  )}
                </Td>
              </tr>
            );
          })}
        </TBody>
      </Table>
      <section aria-labelledby="detergents-title" className="mt-8">
        <h2 id="detergents-title" className="mb-2 text-base font-semibold">
          Detergents
        </h2>
        <Table caption="Detergent register">
          <THead>
            <Th>Detergent</Th>
            <Th>Supplier</Th>
            <Th>Titration method</Th>
            <Th align="right">Factor</Th>
          </THead>
          <TBody>
            {detergents.length === 0 ? (
              <EmptyRow colSpan={4}>No detergent registered: titrations need one.</EmptyRow>
            ) : (
              detergents.map((d) => (
                <tr key={d.id}>
                  <Td>{d.name}</Td>
                  <Td>{d.supplier ?? "—"}</Td>
                  <Td>{d.titrationMethod ?? "—"}</Td>
                  <Td numeric className="whitespace-nowrap">
                    {d.factorPctPerMl} % per mL
                  </Td>
                </tr>
              ))
            )}
          </TBody>
        </Table>
        {can(user.roles, "bath.manage_intervals") && (
          <div className="mt-3">
            <DetergentForm action={saveDetergentAction} />
          </div>
        )}
      </section>
    </>
  );
}
