import { CircleCheck, CircleHelp, CircleX, Lock, PenLine, FilePen, Archive } from "lucide-react";
import type { Outcome } from "@/db/enums";

/** Outcome as a word with an icon; colour only repeats what the word says. */
export function OutcomeWord({ outcome }: { outcome: Outcome | null }) {
  if (outcome === "pass")
    return (
      <span className="inline-flex items-center gap-1 font-medium text-brand-800">
        <CircleCheck className="h-4 w-4" aria-hidden="true" /> Pass
      </span>
    );
  if (outcome === "fail")
    return (
      <span className="inline-flex items-center gap-1 font-medium text-red-800">
        <CircleX className="h-4 w-4" aria-hidden="true" /> Fail
      </span>
    );
  return (
    <span className="inline-flex items-center gap-1 text-stone-700">
      <CircleHelp className="h-4 w-4" aria-hidden="true" /> Incomplete
    </span>
  );
}

const STATUS = {
  open: { label: "Open", Icon: FilePen },
  performed: { label: "Performed", Icon: PenLine },
  verified: { label: "Verified (locked)", Icon: Lock },
  superseded: { label: "Superseded", Icon: Archive },
} as const;

export function RunStatusWord({ status }: { status: keyof typeof STATUS }) {
  const { label, Icon } = STATUS[status];
  return (
    <span className="inline-flex items-center gap-1 text-stone-800">
      <Icon className="h-4 w-4" aria-hidden="true" /> {label}
    </span>
  );
}
