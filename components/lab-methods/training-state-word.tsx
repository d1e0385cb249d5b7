import { CircleAlert, CircleCheck, CircleMinus, CircleX } from "lucide-react";
import { formatDate } from "@/lib/format/date";
import { TRAINING_STATE_LABELS, type TrainingState } from "@/lib/training/rules";

const ICONS = {
  current: CircleCheck,
  expires_soon: CircleAlert,
  lapsed: CircleX,
  never: CircleMinus,
} as const;

/** A training state as a word with an icon and its date; colour only repeats the word. */
export function TrainingStateWord({
  state,
  expiresOn,
  subject = "method",
}: {
  state: TrainingState;
  expiresOn: string | null;
  /** A procedure is acknowledged, not trained on: its "never" reads so. */
  subject?: "method" | "procedure";
}) {
  const Icon = ICONS[state];
  const tone =
    state === "lapsed" ? "text-red-800" : state === "current" ? "text-brand-800" : "text-stone-700";
  return (
    <span className={`inline-flex items-center gap-1 ${tone}`}>
      <Icon className="h-4 w-4" aria-hidden="true" />
      <span>
        {subject === "procedure" && state === "never"
          ? "Not acknowledged"
          : TRAINING_STATE_LABELS[state]}
        {expiresOn && state !== "lapsed" && (
          <span className="text-xs text-stone-600"> until {formatDate(expiresOn)}</span>
        )}
        {expiresOn && state === "lapsed" && (
          <span className="text-xs text-stone-600"> on {formatDate(expiresOn)}</span>
        )}
      </span>
    </span>
  );
}
