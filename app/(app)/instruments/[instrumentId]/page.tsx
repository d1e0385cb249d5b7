import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { RunStatusWord } from "@/components/evidence/status-word";
import {
  CalibrationForm,
  EditInstrumentForm,
  RetireInstrumentForm,
} from "@/components/instruments/instrument-forms";
import { Caution } from "@/components/ui/caution";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate, todayUtc } from "@/lib/format/date";
import { withUnit } from "@/lib/format/number";
import { DUE_STATE_LABELS, overdueSince, usesExpiry } from "@/lib/instruments/calibration";
import {
  CALIBRATION_PERFORMER_LABELS,
  CALIBRATION_RESULT_LABELS,
  INSTRUMENT_KIND_LABELS,
  INSTRUMENT_STATUS_LABELS,
  type InstrumentKind,
} from "@/lib/instruments/kinds";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getInstrumentDetail } from "@/lib/server/instruments/queries";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ instrumentId: string }>;
}): Promise<Metadata> {
  return recordTitle("instrument", (await params).instrumentId, "Instrument");
}

/** Kinds checked in place on a washer, where the bath, the spray or the line is live. */
const CHECKED_IN_PLACE: readonly InstrumentKind[] = [
  "thermometer",
  "thermocouple",
  "conductivity_meter",
  "pressure_gauge",
];

export default async function InstrumentPage({
  params,
}: {
  params: Promise<{ instrumentId: string }>;
}) {
  const user = await requirePageUser("instrument.view");
  const { instrumentId } = await params;
  const detail = /^[0-9a-f-]{36}$/.test(instrumentId)
    ? await getInstrumentDetail(instrumentId)
    : undefined;
  if (!detail) notFound();
  const { instrument: i, state, calibrations, runs } = detail;
  const ink = usesExpiry(i.kind);
  const manage = can(user.roles, "instrument.manage") && i.status !== "retired";
  const standing =
    state === "overdue" && i.dueOn
      ? `${ink ? "Expired" : "Overdue"} since ${formatDate(overdueSince(i.dueOn))} (${ink ? "expiry" : "due"} ${formatDate(i.dueOn)})`
      : state === "current" || state === "due_soon"
        ? `${DUE_STATE_LABELS[state]}: ${ink ? "expires" : "due"} ${formatDate(i.dueOn)}`
        : ink && state === "never_calibrated"
          ? "No expiry date recorded"
          : DUE_STATE_LABELS[state];
  return (
    <>
      <PageHeader
        title={`${i.assetNumber} · ${INSTRUMENT_KIND_LABELS[i.kind]}`}
        description={
          <span className="flex flex-wrap gap-x-4 gap-y-1">
            <span className="font-medium">{INSTRUMENT_STATUS_LABELS[i.status]}</span>
            <span>{standing}</span>
            <span>{i.description}</span>
          </span>
        }
      />
      <div className="grid gap-6 xl:grid-cols-[1fr_24rem]">
        <div className="space-y-6">
          <section aria-labelledby="calibrations-title" className="space-y-3">
            <h2 id="calibrations-title" className="text-base font-semibold">
              {ink ? "Calibrations (a test-ink set has an expiry date instead)" : "Calibrations"}
            </h2>
            <Table caption="Calibration history">
              <THead>
                <Th>Calibrated on</Th>
                <Th>Next due</Th>
                <Th>Result as found</Th>
                <Th>By</Th>
                <Th>Certificate</Th>
                <Th>Nonconformance</Th>
              </THead>
              <TBody>
                {calibrations.length === 0 && (
                  <EmptyRow colSpan={6}>No calibration recorded.</EmptyRow>
                )}
                {calibrations.map(({ c, file, nc, recordedBy }) => (
                  <tr key={c.id}>
                    <Td>{formatDate(c.calibratedOn)}</Td>
                    <Td>{formatDate(c.dueOn)}</Td>
                    <Td className="font-medium">
                      {CALIBRATION_RESULT_LABELS[c.result]}
                      {c.note && (
                        <span className="block text-xs font-normal text-stone-700">{c.note}</span>
                      )}
                    </Td>
                    <Td>
                      {c.performedBy}
                      <span className="block text-xs text-stone-600">
                        {CALIBRATION_PERFORMER_LABELS[c.performer]}
                        {recordedBy ? `; recorded by ${recordedBy}` : ""}
                      </span>
                    </Td>
                    <Td>
                      {c.certificateNumber ?? ""}
                      {file?.id ? (
                        <a
                          href={`/api/evidence/files/${file.id}`}
                          className="block text-brand-800 hover:underline"
                        >
                          {file.name}
                        </a>
                      ) : (
                        !c.certificateNumber && "—"
                      )}
                    </Td>
                    <Td>
                      {nc?.id ? (
                        <IntentLink
                          href={`/nonconformances/${nc.id}`}
                          className="text-brand-800 underline"
                        >
                          {nc.number}
                        </IntentLink>
                      ) : (
                        "—"
                      )}
                    </Td>
                  </tr>
                ))}
              </TBody>
            </Table>
          </section>

          {manage && !ink && (
            <section aria-labelledby="record-title" className="space-y-3">
              <h2 id="record-title" className="text-base font-semibold">
                Record a calibration
              </h2>
              {CHECKED_IN_PLACE.includes(i.kind) && (
                <Caution title="checking an instrument in place">
                  A probe or gauge on a running washer sits in hot water, alkaline or acidic
                  detergent, or a pressurised line. Isolate and cool the stage as the site&apos;s
                  procedures require, and follow the detergent&apos;s safety data sheet and local
                  codes.
                </Caution>
              )}
              <CalibrationForm
                instrumentId={i.id}
                today={todayUtc()}
                intervalMonths={i.calibrationIntervalMonths}
              />
            </section>
          )}

          <section aria-labelledby="runs-title" className="space-y-3">
            <h2 id="runs-title" className="text-base font-semibold">
              Runs that cited it (latest 20)
            </h2>
            <Table caption="Runs citing this instrument" density="compact">
              <THead>
                <Th>Run</Th>
                <Th>Test date</Th>
                <Th>Status</Th>
              </THead>
              <TBody>
                {runs.length === 0 && <EmptyRow colSpan={3}>No run cites it.</EmptyRow>}
                {runs.map((r) => (
                  <tr key={r.id}>
                    <Td>
                      <IntentLink
                        href={`/evidence/runs/${r.id}`}
                        className="text-brand-800 underline"
                      >
                        {r.number}
                        {r.revision > 1 ? ` rev ${r.revision}` : ""}
                      </IntentLink>
                    </Td>
                    <Td>{formatDate(r.performedOn, "not yet tested")}</Td>
                    <Td>
                      <RunStatusWord status={r.status} />
                    </Td>
                  </tr>
                ))}
              </TBody>
            </Table>
          </section>
        </div>

        <aside className="space-y-6">
          <section
            aria-labelledby="entry-title"
            className="rounded-lg border border-stone-200 bg-white p-4 text-sm"
          >
            <h2 id="entry-title" className="mb-2 font-semibold">
              Register entry
            </h2>
            <dl className="grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1">
              <dt className="text-stone-500">Location</dt>
              <dd>{i.location}</dd>
              <dt className="text-stone-500">Range</dt>
              <dd>{i.range ?? "—"}</dd>
              <dt className="text-stone-500">Resolution</dt>
              <dd>{i.resolution ?? "—"}</dd>
              <dt className="text-stone-500">{ink ? "Expiry date" : "Interval"}</dt>
              <dd>
                {ink ? formatDate(i.expiresOn) : withUnit(i.calibrationIntervalMonths, "months")}
              </dd>
              <dt className="text-stone-500">Status</dt>
              <dd>
                {INSTRUMENT_STATUS_LABELS[i.status]}
                {i.statusReason && (
                  <span className="block text-xs text-stone-700">{i.statusReason}</span>
                )}
              </dd>
            </dl>
          </section>
          {manage && (
            <section
              aria-labelledby="edit-title"
              className="space-y-3 rounded-lg border border-stone-200 bg-white p-4"
            >
              <h2 id="edit-title" className="font-semibold">
                Edit
              </h2>
              <EditInstrumentForm instrument={i} />
            </section>
          )}
          {manage && (
            <section
              aria-labelledby="retire-title"
              className="space-y-3 rounded-lg border border-stone-200 bg-white p-4"
            >
              <h2 id="retire-title" className="font-semibold">
                Retire
              </h2>
              <RetireInstrumentForm instrumentId={i.id} />
            </section>
          )}
        </aside>
      </div>
    </>
  );
}
