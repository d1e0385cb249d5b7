import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { BathLimitForm, BathRecordForm, IntervalForm } from "@/components/evidence/bath-forms";
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
import { recordTitle } from "@/lib/server/page-titles";
import { getTank, listDetergents } from "@/lib/server/bath/queries";
import { setBathLimitAction } from "../actions";
import { BATH_CHEMISTRY, LIMIT_STATE_LABELS } from "@/lib/bath/limits";
import { rangeWithUnit } from "@/lib/format/number";
import { recordBathAction, setMaintenanceIntervalAction } from "../../actions";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ stageId: string }>;
}): Promise<Metadata> {
  return recordTitle("tank", (await params).stageId, "Tank log");
}

export default async function TankPage({ params }: { params: Promise<{ stageId: string }> }) {
  const user = await requirePageUser("evidence.view");
  const { stageId } = await params;
  const tank = /^[0-9a-f-]{36}$/.test(stageId) ? await getTank(stageId) : undefined;
  if (!tank) notFound();
  const detergentOptions = (await listDetergents()).map((d) => ({
    value: d.id,
    label: `${d.name} (${d.factorPctPerMl} % per mL)`,
  }));
  const planOf = (v: BathVariable) => tank.plan.find((l) => l.variable === v) ?? null;
  const charts = (Object.keys(BATH_VARIABLES) as BathVariable[])
    .map((v) =>
      bathControlChart(
        tank.records.map((r) => ({ performedAt: r.record.performedAt, values: r.record })),
        v,
        planOf(v),
      ),
    )
    .filter((c) => c !== null);
  const latestGraded = [...tank.records].reverse().find((r) => r.record.limitState !== null);
  return (
    <>
      <PageHeader
        title={`${tank.system.code} · ${tank.stage.name}`}
        description={[
          tank.stage.tankVolumeL !== null ? `Tank volume ${tank.stage.tankVolumeL} L.` : null,
          tank.age.days !== null
            ? `Bath age ${tank.age.days} days since ${tank.age.recharged ? "the last dump and recharge" : "the first log entry (no recharge logged)"} on ${formatDate(tank.age.chargedAt)}; ${tank.age.cycles === 1 ? "1 wash cycle" : `${tank.age.cycles ?? 0} wash cycles`} since.`
            : "Bath age unknown: nothing logged yet.",
        ]
          .filter(Boolean)
          .join(" ")}
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
        <Caution title="detergents and titration reagents">
          Handle concentrate and titrants as their safety data sheets say, and dispose of a dumped
          bath as local codes require; this page does not replace either.
        </Caution>
      </div>
      {latestGraded && (
        <p
          className="mb-6 rounded-md border border-stone-300 bg-white p-3 text-sm"
          role="status"
          aria-label="Latest graded reading"
        >
          Latest graded reading ({formatDateTime(latestGraded.record.performedAt)}):{" "}
          <strong>{LIMIT_STATE_LABELS[latestGraded.record.limitState!]}</strong>
          {latestGraded.record.limitFindings ? ` — ${latestGraded.record.limitFindings}.` : "."}
        </p>
      )}
      <section aria-labelledby="plan-title" className="mb-6">
        <h2 id="plan-title" className="mb-2 text-base font-semibold">
          Measurement plan
        </h2>
        <Table caption="Measurement plan" density="compact">
          <THead>
            <Th>Value</Th>
            <Th align="right">Target</Th>
            <Th align="right">Action limits</Th>
            <Th align="right">Reject limits</Th>
            <Th>Taken from</Th>
            <Th>Detergent</Th>
          </THead>
          <TBody>
            {tank.plan.length === 0 ? (
              <EmptyRow colSpan={6}>No plan line yet: readings are logged but not graded.</EmptyRow>
            ) : (
              tank.plan.map((l) => {
                const unit = BATH_CHEMISTRY[l.variable].unit;
                return (
                  <tr key={l.id}>
                    <Td>{BATH_CHEMISTRY[l.variable].label}</Td>
                    <Td numeric>{withUnit(l.target, unit)}</Td>
                    <Td numeric>{rangeWithUnit(l.actionLow, l.actionHigh, unit)}</Td>
                    <Td numeric>{rangeWithUnit(l.rejectLow, l.rejectHigh, unit)}</Td>
                    <Td>
                      {l.recipe}
                      {l.recipeVersionStatus !== "effective" && (
                        <strong className="block text-xs">
                          No longer in force: set the line again from the effective version.
                        </strong>
                      )}
                    </Td>
                    <Td>{l.detergent?.name ?? "—"}</Td>
                  </tr>
                );
              })
            )}
          </TBody>
        </Table>
        {can(user.roles, "bath.manage_intervals") && (
          <div className="mt-3">
            <BathLimitForm
              action={setBathLimitAction}
              stageId={tank.stage.id}
              versions={tank.effectiveVersions.map((v) => ({
                value: v.id,
                label: `${v.code} v${v.version}`,
              }))}
              detergents={detergentOptions}
            />
          </div>
        )}
      </section>
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
          <BathRecordForm
            action={recordBathAction}
            stageId={tank.stage.id}
            detergents={detergentOptions}
          />
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
            <Th align="right">pH</Th>
            <Th align="right">Oil</Th>
            <Th>Against plan</Th>
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
                <Td numeric>{r.ph ?? "—"}</Td>
                <Td numeric className="whitespace-nowrap">
                  {withUnit(r.oilContentGPerL, "g/L")}
                </Td>
                <Td>
                  {r.limitState ? (
                    <>
                      <strong>{LIMIT_STATE_LABELS[r.limitState]}</strong>
                      {r.limitFindings && <span className="block text-xs">{r.limitFindings}</span>}
                    </>
                  ) : (
                    "—"
                  )}
                </Td>
                <Td className="font-mono text-xs">
                  {r.countPerMl4 !== null && r.countPerMl6 !== null && r.countPerMl14 !== null
                    ? iso4406Code([r.countPerMl4, r.countPerMl6, r.countPerMl14])
                    : "—"}
                </Td>
                <Td className="min-w-48">
                  {[
                    r.titrantVolumeMl !== null
                      ? `titrated: ${r.titrantVolumeMl} mL × ${r.titrationFactor} % per mL`
                      : null,
                    r.additionQuantity !== null
                      ? `added ${r.additionQuantity} ${r.additionUnit ?? ""} of lot ${r.additionLot ?? "—"}`
                      : null,
                    r.filterDescription,
                    r.filterRatingUm !== null ? `rating ${r.filterRatingUm} µm` : null,
                    r.differentialPressureBar !== null
                      ? `Δp ${r.differentialPressureBar} bar before the change`
                      : null,
                    r.checkResult ? (r.checkResult === "pass" ? "Pass" : "Fail") : null,
                    r.notes,
                  ]
                    .filter(Boolean)
                    .join(" · ") || "—"}
                  {r.photoFileId && (
                    <a
                      href={`/api/evidence/files/${r.photoFileId}`}
                      className="block text-brand-800 underline"
                    >
                      Photo
                    </a>
                  )}
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
