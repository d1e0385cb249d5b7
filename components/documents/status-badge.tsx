import { Archive, CircleCheck, CircleDashed, Eye, History, PenLine } from "lucide-react";
import type { DocumentStatus } from "@/db/enums";
import { DOCUMENT_STATUS_LABELS } from "@/lib/documents/lifecycle";

const ICONS = {
  draft: PenLine,
  in_review: Eye,
  approved: CircleDashed,
  effective: CircleCheck,
  superseded: History,
  retired: Archive,
} as const;
const TONES: Record<DocumentStatus, string> = {
  draft: "border-stone-300 bg-white text-stone-700",
  in_review: "border-brand-300 bg-brand-50 text-brand-900",
  approved: "border-brand-300 bg-brand-50 text-brand-900",
  effective: "border-brand-700 bg-brand-700 text-white",
  superseded: "border-stone-300 bg-stone-100 text-stone-600",
  retired: "border-stone-300 bg-stone-100 text-stone-600",
};

/** A version's status as a word with an icon; the colour only repeats what the word says. */
export function StatusBadge({ status }: { status: DocumentStatus }) {
  const Icon = ICONS[status];
  return (
    <span
      className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-medium whitespace-nowrap ${TONES[status]}`}
    >
      <Icon className="h-3.5 w-3.5" aria-hidden="true" />
      {DOCUMENT_STATUS_LABELS[status]}
    </span>
  );
}
