import { IntentLink } from "@/components/ui/intent-link";
import type { PlantOverview } from "@/lib/server/overview/load-overview";

interface Tile {
  label: string;
  value: number;
  /** What the number means beyond itself, in words. */
  note: string;
  href: string;
  /** Needs someone now: drawn with a heavier border and said in the note. */
  urgent: boolean;
}

/** The plant's open and overdue records as counted tiles, each a link to its records. */
export function SummaryTiles({ summary }: { summary: PlantOverview["summary"] }) {
  const tiles: Tile[] = [
    {
      label: "Overdue tests and checks",
      value: summary.overdue.overdue,
      note: summary.overdue.due > 0 ? `${summary.overdue.due} more due soon` : "none due soon",
      href: "#overdue-tests",
      urgent: summary.overdue.overdue > 0,
    },
    {
      label: "Open change requests",
      value: summary.openChanges,
      note: "draft to verified",
      href: "/changes",
      urgent: false,
    },
    {
      label: "Emergency changes not closed",
      value: summary.emergencyChanges,
      note:
        summary.overdueEmergencies > 0
          ? `${summary.overdueEmergencies} past approval date`
          : "none past approval date",
      href: "/changes?q=Emergency",
      urgent: summary.overdueEmergencies > 0,
    },
    {
      label: "Open nonconformances",
      value: summary.openNonconformances,
      note: "not yet closed",
      href: "/nonconformances",
      urgent: false,
    },
    {
      label: "Active temporary deviations",
      value: summary.activeDeviations,
      note: "running outside a validated range",
      href: "/deviations?state=active",
      urgent: false,
    },
  ];
  return (
    <section aria-label="Plant summary">
      <ul className="grid grid-cols-2 gap-3 md:grid-cols-3 xl:grid-cols-5">
        {tiles.map((t) => (
          <li key={t.label}>
            <IntentLink
              href={t.href}
              className={`block h-full rounded-lg border bg-white px-4 py-3 hover:bg-stone-50 ${
                t.urgent ? "border-2 border-red-700" : "border-stone-200"
              }`}
            >
              <span className="block text-sm text-stone-700">{t.label}</span>
              <span className="mt-1 block text-2xl font-semibold text-stone-900 tabular-nums">
                {t.value}
              </span>
              <span
                className={`block text-xs ${t.urgent ? "font-medium text-red-800" : "text-stone-600"}`}
              >
                {t.urgent ? "Needs action: " : ""}
                {t.note}
              </span>
            </IntentLink>
          </li>
        ))}
      </ul>
    </section>
  );
}
