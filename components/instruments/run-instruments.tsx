import { IntentLink } from "@/components/ui/intent-link";
import { formatDate, todayUtc } from "@/lib/format/date";
import {
  dueState,
  DUE_STATE_LABELS,
  overdueSince,
  usesExpiry,
} from "@/lib/instruments/calibration";
import { INSTRUMENT_KIND_LABELS, INSTRUMENT_STATUS_LABELS } from "@/lib/instruments/kinds";
import { instrumentsToCite } from "@/lib/server/instruments/queries";
import { CiteInstrumentsForm } from "./cite-instruments-form";

type Row = Awaited<ReturnType<typeof instrumentsToCite>>["options"][number];

/** "Overdue since 2026-12-01 (due 2026-11-30)": an instrument's standing in words. */
function standing(i: Row, today: string) {
  const state = dueState(i, today);
  const ink = usesExpiry(i.kind);
  if (state === "overdue" && i.dueOn)
    return `${ink ? "expired" : "overdue"} since ${formatDate(overdueSince(i.dueOn))}`;
  if ((state === "current" || state === "due_soon") && i.dueOn)
    return `${ink ? "expires" : "due"} ${formatDate(i.dueOn)}`;
  return DUE_STATE_LABELS[state].toLowerCase();
}

/** On a test run: the instruments it used with their calibration standing, and the form to change them while open. */
export async function RunInstruments({ runId, mayRecord }: { runId: string; mayRecord: boolean }) {
  const { options, citedIds } = await instrumentsToCite(runId);
  const today = todayUtc();
  const cited = options.filter((o) => citedIds.includes(o.id));
  return (
    <section aria-labelledby="instruments-title" className="space-y-3">
      <h2 id="instruments-title" className="text-base font-semibold">
        Instruments used
      </h2>
      {cited.length === 0 ? (
        <p className="text-sm text-stone-600">No instrument cited.</p>
      ) : (
        <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm">
          {cited.map((i) => (
            <li key={i.id} className="px-3 py-2">
              <IntentLink
                href={`/instruments/${i.id}`}
                className="font-medium text-brand-800 underline"
              >
                {i.assetNumber}
              </IntentLink>{" "}
              · {INSTRUMENT_KIND_LABELS[i.kind]} · {i.description}
              <span className="block text-xs text-stone-700">
                {INSTRUMENT_STATUS_LABELS[i.status]}; calibration {standing(i, today)}
              </span>
            </li>
          ))}
        </ul>
      )}
      {mayRecord && (
        <CiteInstrumentsForm
          runId={runId}
          cited={citedIds}
          options={options.map((i) => ({
            value: i.id,
            label: `${i.assetNumber} · ${INSTRUMENT_KIND_LABELS[i.kind]} · ${i.description} (${standing(i, today)})`,
          }))}
        />
      )}
    </section>
  );
}
