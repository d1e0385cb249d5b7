import { IntentLink } from "@/components/ui/intent-link";
import { EmergencyBadge } from "@/components/changes/change-types-panels";
import { humanize } from "@/lib/format/labels";
import { formatBytes, rangeWithUnit, withUnit } from "@/lib/format/number";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { MEANING_LABELS } from "@/lib/signatures/rules";
import type { ParameterHistory } from "@/lib/server/trace/parameter-history";
import {
  BINDING_LABELS,
  CHANGE_LABELS,
  OUTCOME_LABELS,
  periodStatus,
  uncontrolledOrigin,
} from "@/lib/trace/labels";
import { formatDate, formatDateTime } from "@/lib/format/date";
import type { ParameterValue } from "@/lib/trace/timeline";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

type Entry = ParameterHistory["entries"][number];

function valueText(v: ParameterValue | null) {
  return v ? withUnit(v.setpoint, v.unit) : "not in the recipe";
}

/** Newest first: each value the parameter has had, with the change that brought it and the evidence behind it. */
export function ParameterTimeline({
  history,
  canExport,
}: {
  history: ParameterHistory;
  canExport: boolean;
}) {
  // Each entry's previous value is the last value in force before it (entries arrive oldest first);
  // before the oldest entry shown, the service says what was in force among those not shown.
  const rows = history.entries.map((entry, i) => {
    const earlier = history.entries.slice(0, i).findLast((e) => e.period.kind === "in_force");
    return { entry, previous: earlier ? earlier.period.value : history.older?.previous };
  });
  return (
    <ol aria-label="Parameter history" className="space-y-6">
      {rows.reverse().map(({ entry, previous }) => (
        <TimelineEntry
          key={entry.period.introducedBy.versionId}
          entry={entry}
          previous={previous}
          canExport={canExport}
        />
      ))}
    </ol>
  );
}

function TimelineEntry({
  entry,
  previous,
  canExport,
}: {
  entry: Entry;
  previous: ParameterValue | null | undefined;
  canExport: boolean;
}) {
  const { period, change } = entry;
  const v = period.value;
  const versions = period.versions.map((x) => x.version);
  const versionLabel =
    versions.length > 1 ? `Versions ${versions[0]}–${versions.at(-1)}` : `Version ${versions[0]}`;
  const title = `${versionLabel}: ${valueText(v)}`;
  return (
    <li>
      <article
        aria-label={title}
        className={`rounded-lg border bg-white p-5 ${period.kind === "proposal" ? "border-dashed border-stone-400" : "border-stone-200"}`}
      >
        <header className="flex flex-wrap items-baseline justify-between gap-2">
          <h3 className="text-base font-semibold">{title}</h3>
          <p className="text-sm">
            <span className="font-semibold">{periodStatus(period)}</span> ·{" "}
            {CHANGE_LABELS[period.change]}
          </p>
        </header>
        <dl className="mt-3 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[max-content_1fr]">
          <dt className="text-stone-600">Setpoint</dt>
          <dd>
            {previous !== undefined && period.change !== "first" ? (
              <>
                {valueText(previous)} → <span className="font-semibold">{valueText(v)}</span>
              </>
            ) : (
              <span className="font-semibold">{valueText(v)}</span>
            )}
          </dd>
          <dt className="text-stone-600">Validated range</dt>
          <dd>
            {previous &&
            v &&
            (previous.validatedLow !== v.validatedLow ||
              previous.validatedHigh !== v.validatedHigh) ? (
              <>
                {rangeWithUnit(previous.validatedLow, previous.validatedHigh, previous.unit)} →{" "}
                <span className="font-semibold">
                  {rangeWithUnit(v.validatedLow, v.validatedHigh, v.unit)}
                </span>
              </>
            ) : v ? (
              rangeWithUnit(v.validatedLow, v.validatedHigh, v.unit)
            ) : (
              "—"
            )}
          </dd>
          {period.kind === "in_force" && (
            <>
              <dt className="text-stone-600">In force</dt>
              <dd>
                from {formatDateTime(period.effectiveFrom)}{" "}
                {period.effectiveTo ? `to ${formatDateTime(period.effectiveTo)}` : "until now"}
              </dd>
            </>
          )}
        </dl>

        {change ? (
          <section
            aria-label={`Change request ${change.number}`}
            className="mt-4 border-t border-stone-100 pt-3 text-sm"
          >
            <p>
              <IntentLink
                href={`/changes/${change.id}`}
                className="font-semibold text-brand-800 hover:underline"
              >
                {change.number}
              </IntentLink>{" "}
              {change.emergency && <EmergencyBadge />} · {change.title} ·{" "}
              {CHANGE_STATUS_LABELS[change.status]} · impact{" "}
              <span className="font-semibold">{humanize(change.impact)}</span> · opened by{" "}
              {change.author ?? "—"} on {formatDate(change.openedAt)}
              {change.closedAt ? `, closed ${formatDate(change.closedAt)}` : ""}
            </p>
            {change.parameterImpact && (
              <p className="mt-1">
                This parameter:{" "}
                {change.parameterImpact.position === "outside"
                  ? "outside"
                  : change.parameterImpact.position === "inside"
                    ? "inside"
                    : "no position against"}{" "}
                the validated range · {humanize(change.parameterImpact.impact)}
                {change.parameterImpact.reasons.length > 0
                  ? ` — ${change.parameterImpact.reasons.join("; ")}`
                  : ""}
              </p>
            )}
            <blockquote className="mt-2 border-l-2 border-stone-300 pl-3 text-stone-700">
              <span className="sr-only">Justification: </span>
              {change.justification || "No justification written."}
            </blockquote>
            <p className="mt-2 flex flex-wrap gap-x-4">
              <IntentLink
                href={`/changes/${change.id}#diff`}
                className="text-brand-800 hover:underline"
              >
                Parameter diff of {change.number}
              </IntentLink>
              <IntentLink
                href={`/changes/${change.id}#impact`}
                className="text-brand-800 hover:underline"
              >
                Impact with its working
              </IntentLink>
              {canExport && (
                <>
                  <a
                    href={`/api/audit-pack/${change.id}?format=pdf`}
                    className="text-brand-800 hover:underline"
                    download
                  >
                    Audit pack (PDF) for {change.number}
                  </a>
                  <a
                    href={`/api/audit-pack/${change.id}?format=zip`}
                    className="text-brand-800 hover:underline"
                    download
                  >
                    Audit pack with evidence files (ZIP)
                  </a>
                </>
              )}
            </p>

            <h4 className="mt-4 font-semibold">Signatures</h4>
            {change.signatures.length === 0 ? (
              <p className="text-stone-600">No signatures yet.</p>
            ) : (
              <Table
                density="compact"
                caption={<>Signatures on {change.number}</>}
                frameClassName="mt-1"
              >
                <THead>
                  <Th>Meaning</Th>
                  <Th>Printed name</Th>
                  <Th>Signed</Th>
                  <Th>Revision</Th>
                  <Th>Binding</Th>
                </THead>
                <TBody>
                  {change.signatures.map((s) => (
                    <tr key={s.id}>
                      <Td className="font-medium">{MEANING_LABELS[s.meaning]}</Td>
                      <Td>{s.printedName}</Td>
                      <Td className="tabular-nums">{formatDateTime(s.signedAt)}</Td>
                      <Td>{s.revision}</Td>
                      <Td title={`Signed hash ${s.contentHash}`}>{BINDING_LABELS[s.binding]}</Td>
                    </tr>
                  ))}
                </TBody>
              </Table>
            )}

            <h4 className="mt-4 font-semibold">Requalification evidence</h4>
            {change.requirements.length === 0 && change.evidence.length === 0 ? (
              <p className="text-stone-600">
                {change.impact === "major"
                  ? "No required tests recorded."
                  : "None required: the change stayed inside the validated range."}
              </p>
            ) : (
              <>
                {change.requirements.length > 0 && (
                  <p className="text-stone-700">
                    Required:{" "}
                    {change.requirements
                      .map((r) => `${TEST_TYPE_LABELS[r.testType]} on ${r.samples} parts`)
                      .join("; ")}
                    .
                  </p>
                )}
                {change.evidence.length === 0 ? (
                  <p className="text-stone-600">No test run linked yet.</p>
                ) : (
                  <ul className="mt-2 space-y-2" aria-label={`Evidence for ${change.number}`}>
                    {change.evidence.map((run) => (
                      <li key={run.id} className="rounded-md border border-stone-200 p-3">
                        <p>
                          <IntentLink
                            href={`/evidence/runs/${run.id}`}
                            className="font-semibold text-brand-800 hover:underline"
                          >
                            {run.number}
                          </IntentLink>{" "}
                          · {TEST_TYPE_LABELS[run.testType]} · computed outcome{" "}
                          <span className="font-semibold">
                            {run.outcome ? OUTCOME_LABELS[run.outcome] : "not computed"}
                          </span>{" "}
                          · {humanize(run.status)} · {run.samples} samples
                          {run.worstCaseSamples
                            ? ` (${run.worstCaseSamples} at worst-case positions)`
                            : ""}{" "}
                          · performed {run.performedOn ?? "—"}
                          {run.lab ? ` at ${run.lab}` : ""}
                        </p>
                        {run.signatures.length > 0 && (
                          <p className="text-stone-700">
                            {run.signatures
                              .map(
                                (s) =>
                                  `${MEANING_LABELS[s.meaning]} by ${s.printedName}, ${formatDateTime(s.signedAt)}`,
                              )
                              .join(" · ")}
                          </p>
                        )}
                        {run.files.length === 0 ? (
                          <p className="text-stone-600">No files attached.</p>
                        ) : (
                          <ul className="mt-1" aria-label={`Files of ${run.number}`}>
                            {run.files.map((f) => (
                              <li key={f.id} className="break-all">
                                {f.originalName} ({formatBytes(f.sizeBytes)}) · SHA-256{" "}
                                <span className="font-mono text-xs">{f.sha256}</span>
                              </li>
                            ))}
                          </ul>
                        )}
                      </li>
                    ))}
                  </ul>
                )}
                <p className="mt-2 text-xs text-stone-600">
                  A computed pass supports, and never replaces, the customer&apos;s specification
                  and the engineer&apos;s judgement.
                </p>
              </>
            )}
          </section>
        ) : (
          <section
            aria-label="How this value took force"
            className="mt-4 border-t border-stone-100 pt-3 text-sm text-stone-700"
          >
            <p>
              {uncontrolledOrigin({
                firstVersion: versions[0] === 1,
                effectiveFrom: period.effectiveFrom,
                author: entry.versionAuthor,
                enteredAt: entry.versionCreatedAt,
              })}{" "}
              {entry.versionNote ?? ""}
            </p>
            {entry.validations.length === 0 ? (
              <p className="mt-1 text-stone-600">No validation is recorded for this version.</p>
            ) : (
              <ul className="mt-1" aria-label={`Validation of version ${versions[0]}`}>
                {entry.validations.map((q) => (
                  <li key={q.partFamilyId}>
                    Validated for{" "}
                    <IntentLink
                      href={`/parts/families/${q.partFamilyId}`}
                      className="font-semibold text-brand-800 hover:underline"
                    >
                      {q.partFamily} {q.partFamilyName}
                    </IntentLink>
                    : {q.basis ?? "carried over by a change"}, qualified {formatDate(q.qualifiedAt)}{" "}
                    (
                    <IntentLink
                      href="/parts/combinations"
                      className="text-brand-800 hover:underline"
                    >
                      qualified combinations
                    </IntentLink>
                    )
                  </li>
                ))}
              </ul>
            )}
          </section>
        )}
      </article>
    </li>
  );
}
