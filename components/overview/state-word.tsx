import { CircleAlert, CircleCheck, OctagonAlert, CircleHelp } from "lucide-react";
import type { ReactNode } from "react";
import { OVERVIEW_STATE_LABELS, type OverviewState } from "@/lib/overview/state";

const STYLE: Record<OverviewState, { Icon: typeof CircleCheck; className: string }> = {
  action: { Icon: OctagonAlert, className: "border-red-300 bg-red-50 text-red-900" },
  attention: { Icon: CircleAlert, className: "border-stone-400 bg-stone-100 text-stone-900" },
  in_order: { Icon: CircleCheck, className: "border-brand-200 bg-brand-50 text-brand-900" },
};

/** A washer's or the plant's state: the word and an icon, the colour only repeating them. */
export function OverviewStateWord({ state }: { state: OverviewState }) {
  const { Icon, className } = STYLE[state];
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-medium ${className}`}
    >
      <Icon className="h-4 w-4" aria-hidden="true" />
      {OVERVIEW_STATE_LABELS[state]}
    </span>
  );
}

/** A smaller state in a table cell: an icon for the worst states and always the word. */
export function CellState({
  level,
  children,
}: {
  level: "bad" | "warn" | "ok" | "none";
  children: ReactNode;
}) {
  const Icon =
    level === "bad"
      ? OctagonAlert
      : level === "warn"
        ? CircleAlert
        : level === "ok"
          ? CircleCheck
          : CircleHelp;
  const tone =
    level === "bad"
      ? "font-medium text-red-800"
      : level === "warn"
        ? "font-medium text-stone-900"
        : level === "ok"
          ? "text-brand-800"
          : "text-stone-600";
  return (
    <span className={`inline-flex items-center gap-1 ${tone}`}>
      <Icon className="h-3.5 w-3.5 shrink-0" aria-hidden="true" />
      {children}
    </span>
  );
}
