import { IntentLink } from "@/components/ui/intent-link";
import { DEVIATION_STATE_LABELS, type DeviationState } from "@/lib/deviations/rules";
import { formatDate } from "@/lib/format/date";
import { rangeWithUnit } from "@/lib/format/number";
import type { Deviation, DeviationParameter } from "@/db/schema";

export interface DeviationSummary {
  deviation: Deviation;
  state: DeviationState;
  parameters: DeviationParameter[];
}

/**
 * Deviations as the trace, the recipe and the run show them: number, state in words, the
 * temporary range beside the validated one, and when it applied.
 */
export function DeviationList({
  label,
  items,
  empty,
}: {
  label: string;
  items: DeviationSummary[];
  empty?: string;
}) {
  if (items.length === 0) return empty ? <p className="text-sm text-stone-600">{empty}</p> : null;
  return (
    <ul aria-label={label} className="space-y-2">
      {items.map(({ deviation: d, state, parameters }) => (
        <li key={d.id} className="rounded-md border border-stone-200 bg-white p-3 text-sm">
          <p>
            <IntentLink
              href={`/deviations/${d.id}`}
              className="font-semibold text-brand-800 underline"
            >
              {d.number}
            </IntentLink>{" "}
            · {d.title} · <span className="font-semibold">{DEVIATION_STATE_LABELS[state]}</span>
          </p>
          <ul className="mt-1 text-stone-700">
            {parameters.map((p) => (
              <li key={p.id}>
                {p.name}: temporary{" "}
                <span className="font-semibold">
                  {rangeWithUnit(p.temporaryLow, p.temporaryHigh, p.unit)}
                </span>{" "}
                instead of the validated {rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)}
              </li>
            ))}
          </ul>
          <p className="mt-1 text-stone-600">
            {d.approvedAt ? `Approved ${formatDate(d.approvedAt)}` : "Not approved"}
            {d.endsOn ? ` · last day ${formatDate(d.endsOn)}` : ""}
            {d.maxLots !== null ? ` · at most ${d.maxLots} lots` : ""}
            {d.endedAt ? ` · ended ${formatDate(d.endedAt)}` : ""}
          </p>
        </li>
      ))}
    </ul>
  );
}
