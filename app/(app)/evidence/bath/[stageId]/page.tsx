import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { BathRecordForm, IntervalForm } from "@/components/evidence/bath-forms";
import { ControlChart } from "@/components/evidence/control-chart";
import { Caution } from "@/components/ui/caution";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { iso4406Code } from "@/lib/cleanliness";
import { bathControlChart } from "@/lib/evidence/bath-chart";
import {
  BATH_VARIABLES,
  MAINTENANCE_LABELS,
  STATE_LABELS,
  type BathVariable,
} from "@/lib/evidence/maintenance";
import { withUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getTank } from "@/lib/server/bath/queries";
import { recordBathAction, setMaintenanceIntervalAction } from "../../actions";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Tank log" };

export default async function TankPage({ params }: { params: Promise<{ stageId: string }> }) {
  const user = await requirePageUser("evidence.view");
  const { stageId } = await params;
  const tank = /^[0-9a-f-]{36}$/.test(stageId) ? await getTank(stageId) : undefined;
  if (!tank) notFound();
  const charts = (Object.keys(BATH_VARIABLES) as BathVariable[])
    .map((v) =>
      bathControlChart(
        tank.records.map((r) => ({ performedAt: r.record.performedAt, values: r.record })),
        v,
      ),
    )
    .filter((c) => c !== null);
  return (
    <>
      <PageHeader
        title={`${tank.system.code} · ${tank.stage.name}`}
        description={
          tank.stage.tankVolumeL !== null ? `Tank volume ${tank.stage.tankVolumeL} L` : undefined
        }
      />
      <div className="mb-6 space-y-2">
        <Caution title="isolate the machine before a filter change">
          Switch off, isolate and lock out the washer and let pressure and temperature fall before
          opening a filter housing or draining a tank; follow the site&apos;s lock-out procedure.
        </Caution>
        <Caution title="hot alkaline bath">
          Bath changes and samples involve hot, alkaline detergent solution: wear eye and skin
          protection as the safety data sheet requires.
        </Caution>
      </div>
      <section aria-labelledby="due-title" className="mb-6">
        <h2 id="due-title" className="mb-2 text-base font-semibold">
          Maintenance intervals
        </h2>
        {tank.maintenance.length === 0 ? (
          <p className="text-sm text-stone-600">No interval set for this tank.</p>
        ) : (
          <ul className="mb-3 space-y-1 text-sm">
            {tank.maintenance.map((m) => (
              <li key={m.intervalId}>
                {MAINTENANCE_LABELS[m.kind]} every {m.intervalDays} days:{" "}
                <strong>{STATE_LABELS[m.status.state]}</strong>, due {formatDate(m.status.dueAt)}{" "}
                (last {formatDate(m.status.lastDoneAt, "never recorded")})
              </li>
            ))}
          </ul>
        )}
        {can(user.roles, "bath.manage_intervals") && (
          <IntervalForm action={setMaintenanceIntervalAction} stageId={tank.stage.id} />
        )}
      </section>
      {can(user.roles, "bath.record") && (
        <section aria-labelledby="record-title" className="mb-6">
          <h2 id="record-title" className="mb-2 text-base font-semibold">
            Record
          </h2>
          <BathRecordForm action={recordBathAction} stageId={tank.stage.id} />
        </section>
      )}
      <section aria-labelledby="charts-title" className="mb-6 space-y-4">
        <h2 id="charts-title" className="text-base font-semibold">
          Control charts
        </h2>
        {charts.length === 0 ? (
          <p className="text-sm text-stone-600">
            At least two readings of a value are needed for its chart.
          </p>
        ) : (
          charts.map((c) => <ControlChart key={c.title} {...c} />)
        )}
      </section>
      <section aria-labelledby="log-title">
        <h2 id="log-title" className="mb-2 text-base font-semibold">
          Log
        </h2>
        <Table caption="Bath log">
          <THead>
            <Th>When (UTC)</Th>
            <Th>What</Th>
            <Th align="right">Concentration</Th>
            <Th align="right">Conductivity</Th>
            <Th align="right">Temperature</Th>
            <Th>ISO 4406</Th>
            <Th>Notes</Th>
            <Th>By</Th>
          </THead>
          <TBody>
            {[...tank.records].reverse().map(({ record: r, by }) => (
              <tr key={r.id}>
                <Td className="whitespace-nowrap tabular-nums">
                  {formatDateTime(r.performedAt, { zone: false })}
                </Td>
                <Td>{MAINTENANCE_LABELS[r.kind]}</Td>
                <Td numeric className="whitespace-nowrap">
                  {withUnit(r.concentrationPct, "%")}
                </Td>
                <Td numeric className="whitespace-nowrap">
                  {withUnit(r.conductivityUsPerCm, "µS/cm")}
                </Td>
                <Td numeric className="whitespace-nowrap">
                  {withUnit(r.temperatureC, "°C")}
                </Td>
                <Td className="font-mono text-xs">
                  {r.countPerMl4 !== null && r.countPerMl6 !== null && r.countPerMl14 !== null
                    ? iso4406Code([r.countPerMl4, r.countPerMl6, r.countPerMl14])
                    : "—"}
                </Td>
                <Td className="min-w-48">
                  {[r.filterDescription, r.notes].filter(Boolean).join(" · ") || "—"}
                </Td>
                <Td>{by}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
      </section>
    </>
  );
}
