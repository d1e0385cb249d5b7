import { IntentLink } from "@/components/ui/intent-link";
import { OutcomeWord } from "@/components/evidence/status-word";
import { Table, TBody, Td, Th, THead, EmptyRow } from "@/components/ui/table";
import { LIMIT_STATE_LABELS } from "@/lib/bath/limits";
import { MAINTENANCE_LABELS, STATE_LABELS } from "@/lib/evidence/maintenance";
import { formatDate } from "@/lib/format/date";
import { formatNumber } from "@/lib/format/number";
import { trendChartData } from "@/lib/overview/key-result";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import type {
  OverviewFamilyRow,
  OverviewWasher,
  OpenItem,
} from "@/lib/server/overview/load-overview";
import { CellState, OverviewStateWord } from "./state-word";
import { ResultTrend } from "./result-trend";

const link = "text-brand-800 underline-offset-2 hover:underline";

const REQUAL_WORDS = {
  overdue: "overdue",
  due_soon: "due soon",
  not_due: "in date",
} as const;

const OPEN_KIND = {
  change: { label: "Change requests", href: "/changes" },
  nonconformance: { label: "Nonconformances", href: "/nonconformances" },
  deviation: { label: "Temporary deviations", href: "/deviations?state=active" },
} as const;

function FamilyBlock({ family }: { family: OverviewFamilyRow }) {
  const chart = trendChartData(family.trend);
  return (
    <section
      aria-label={`${family.familyCode} ${family.familyName}`}
      className="rounded-md border border-stone-200 bg-stone-50/60 p-3"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
        <h4 className="text-sm font-semibold text-stone-900">
          <IntentLink href={`/parts/families/${family.familyId}`} className={link}>
            {family.familyCode}
          </IntentLink>{" "}
          <span className="font-normal text-stone-700">{family.familyName}</span>
        </h4>
        <span className="text-xs text-stone-600">Specification {family.specCode}</span>
      </div>
      <ul className="mt-1 space-y-0.5 text-xs text-stone-700">
        {family.combinations.map((c) => (
          <li key={c.recipeId}>
            <IntentLink href={`/systems/recipes/${c.recipeId}`} className={link}>
              {c.recipeCode} v{c.version}
            </IntentLink>
            : requalification {REQUAL_WORDS[c.requalificationState]}, due{" "}
            {formatDate(c.requalificationDue)}
          </li>
        ))}
      </ul>
      <div className="mt-2 space-y-2">
        <Table
          density="compact"
          caption={`Last verified results, ${family.familyCode}`}
          className="[--sticky-bg:var(--color-stone-50)]"
        >
          <THead>
            <Th>Test</Th>
            <Th>Run</Th>
            <Th>Performed</Th>
            <Th>Outcome</Th>
            <Th align="right">Result</Th>
          </THead>
          <TBody>
            {family.last.length === 0 && (
              <EmptyRow colSpan={5}>No verified run on this washer yet.</EmptyRow>
            )}
            {family.last.map((r) => (
              <tr key={r.runId}>
                <Td>{TEST_TYPE_LABELS[r.testType]}</Td>
                <Td>
                  <IntentLink
                    href={`/evidence/runs/${r.runId}`}
                    className={`${link} whitespace-nowrap`}
                  >
                    {r.run}
                  </IntentLink>
                </Td>
                <Td className="whitespace-nowrap">{formatDate(r.at)}</Td>
                <Td>
                  <OutcomeWord outcome={r.outcome} />
                </Td>
                <Td numeric>
                  {r.code && <span className="block font-mono text-xs break-all">{r.code}</span>}
                  {r.key ? (
                    <span>
                      {r.key.atLeast ? "≥ " : ""}
                      {formatNumber(r.key.value, 2)} {r.key.unit}
                      {r.key.limit && (
                        <span className="block text-xs text-stone-600">{r.key.limit.label}</span>
                      )}
                    </span>
                  ) : (
                    !r.code && <span className="text-stone-600">observed</span>
                  )}
                </Td>
              </tr>
            ))}
          </TBody>
        </Table>
        {chart ? (
          <>
            <h5 className="text-xs font-semibold text-stone-700">
              Trend: {TEST_TYPE_LABELS[chart.testType].toLowerCase()}, {chart.label} ({chart.unit})
            </h5>
            <ResultTrend
              data={chart}
              title={`${family.familyCode} ${TEST_TYPE_LABELS[chart.testType]}`}
            />
          </>
        ) : (
          <p className="self-center text-xs text-stone-600">
            No measured result to draw yet: the trend appears after the first verified particle,
            gravimetric, wetting-tension or rinse-conductivity run.
          </p>
        )}
      </div>
    </section>
  );
}

function OpenRecords({ open }: { open: OverviewWasher["open"] }) {
  const total = open.counts.change + open.counts.nonconformance + open.counts.deviation;
  if (total === 0)
    return (
      <p className="text-sm text-stone-600">No open change, nonconformance or active deviation.</p>
    );
  const byKind = (kind: OpenItem["kind"]) => open.items.filter((i) => i.kind === kind);
  return (
    <div className="space-y-2">
      {(Object.keys(OPEN_KIND) as OpenItem["kind"][])
        .filter((k) => open.counts[k] > 0)
        .map((k) => (
          <div key={k}>
            <h5 className="text-xs font-semibold tracking-wide text-stone-600 uppercase">
              <IntentLink href={OPEN_KIND[k].href} className={link}>
                {OPEN_KIND[k].label}: {open.counts[k]} open
              </IntentLink>
            </h5>
            <ul className="mt-0.5 space-y-0.5 text-sm">
              {byKind(k).map((i) => (
                <li key={i.id}>
                  <IntentLink href={i.href} className={link}>
                    {i.number}
                  </IntentLink>{" "}
                  {i.title} · <span className="text-stone-700">{i.status}</span>
                  {i.emergency && (
                    <span className="ml-1 font-medium text-red-800">
                      · Emergency, approval {i.emergency === "overdue" ? "overdue" : "awaited"}
                    </span>
                  )}
                </li>
              ))}
              {open.counts[k] > byKind(k).length && (
                <li className="text-stone-600">
                  and {open.counts[k] - byKind(k).length} more in{" "}
                  <IntentLink href={OPEN_KIND[k].href} className={link}>
                    the list
                  </IntentLink>
                </li>
              )}
            </ul>
          </div>
        ))}
    </div>
  );
}

/** One washer: its state in words, baths against their limits, checks, results by part family and open records. */
export function WasherCard({ washer }: { washer: OverviewWasher }) {
  const shownReasons = washer.state.reasons.slice(0, 6);
  return (
    <article
      aria-labelledby={`washer-${washer.id}`}
      className="rounded-lg border border-stone-200 bg-white p-4"
    >
      <header className="flex flex-wrap items-center justify-between gap-2">
        <h3 id={`washer-${washer.id}`} className="text-base font-semibold text-stone-900">
          <IntentLink href={`/systems/${washer.id}`} className={link}>
            {washer.code}
          </IntentLink>{" "}
          <span className="font-normal text-stone-700">{washer.name}</span>
        </h3>
        <OverviewStateWord state={washer.state.state} />
      </header>
      {shownReasons.length > 0 && (
        <ul
          aria-label={`Why: ${washer.code}`}
          className="mt-2 list-disc pl-5 text-sm text-stone-800"
        >
          {shownReasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
          {washer.state.reasons.length > shownReasons.length && (
            <li>and {washer.state.reasons.length - shownReasons.length} more</li>
          )}
        </ul>
      )}
      <div className="mt-4 grid gap-4 xl:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <div className="space-y-3">
          <h4 className="sr-only">Part families</h4>
          {washer.families.length === 0 ? (
            <p className="text-sm text-stone-600">
              No part family is qualified on an effective recipe of this washer.
            </p>
          ) : (
            washer.families.map((f) => <FamilyBlock key={f.familyId} family={f} />)
          )}
        </div>
        <div className="space-y-4">
          <Table density="compact" caption={`Baths, ${washer.code}`} captionVisible>
            <THead>
              <Th>Tank</Th>
              <Th>Latest graded reading</Th>
            </THead>
            <TBody>
              {washer.tanks.length === 0 && <EmptyRow colSpan={2}>No tank.</EmptyRow>}
              {washer.tanks.map((t) => (
                <tr key={t.stageId}>
                  <Td>
                    <IntentLink href={`/evidence/bath/${t.stageId}`} className={link}>
                      {t.name}
                    </IntentLink>
                  </Td>
                  <Td>
                    {t.state ? (
                      <CellState
                        level={t.state === "reject" ? "bad" : t.state === "action" ? "warn" : "ok"}
                      >
                        {LIMIT_STATE_LABELS[t.state]}
                      </CellState>
                    ) : (
                      <CellState level="none">Not graded yet</CellState>
                    )}
                    {t.at && (
                      <span className="block text-xs text-stone-600">
                        {formatDate(t.at)}
                        {t.state !== "ok" && t.findings ? `: ${t.findings}` : ""}
                      </span>
                    )}
                  </Td>
                </tr>
              ))}
            </TBody>
          </Table>
          <Table density="compact" caption={`Checks and intervals, ${washer.code}`} captionVisible>
            <THead>
              <Th>Check</Th>
              <Th>State</Th>
            </THead>
            <TBody>
              {washer.checks.length === 0 && (
                <EmptyRow colSpan={2}>No interval set for this washer.</EmptyRow>
              )}
              {washer.checks.map((m) => (
                <tr key={m.intervalId}>
                  <Td>
                    <IntentLink href={`/evidence/bath/${m.stageId}`} className={link}>
                      {MAINTENANCE_LABELS[m.kind]}
                    </IntentLink>
                    <span className="block text-xs text-stone-600">{m.tank}</span>
                  </Td>
                  <Td>
                    <CellState
                      level={
                        m.status.state === "overdue"
                          ? "bad"
                          : m.status.state === "due"
                            ? "warn"
                            : "ok"
                      }
                    >
                      {STATE_LABELS[m.status.state]}
                    </CellState>
                    <span className="block text-xs text-stone-600">
                      due {formatDate(m.status.dueAt)}
                    </span>
                  </Td>
                </tr>
              ))}
            </TBody>
          </Table>
          <section aria-label={`Open records, ${washer.code}`}>
            <h4 className="mb-1 text-sm font-semibold text-stone-900">Open records</h4>
            <OpenRecords open={washer.open} />
          </section>
        </div>
      </div>
    </article>
  );
}
