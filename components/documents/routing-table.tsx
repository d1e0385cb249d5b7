import { AlarmClock } from "lucide-react";
import type { DocumentReview } from "@/db/schema";
import { formatDate } from "@/lib/format/date";

const DECISION_WORDS = { reviewed: "Reviewed", sent_back: "Sent back", approved: "Approved", rejected: "Rejected", withdrawn: "Withdrawn (round closed)" } as const;

/** Who the version was routed to, round by round, with due dates and decisions. */
export function RoutingTable({ reviews, now }: { reviews: (DocumentReview & { name: string })[]; now: string }) {
  if (reviews.length === 0) return <p className="text-sm text-stone-600">Not routed yet.</p>;
  return (
    <table className="w-full text-sm">
      <caption className="sr-only">Review routing</caption>
      <thead className="text-left text-xs text-stone-500 uppercase">
        <tr>
          <th className="py-1 pr-2 font-medium">Round · step</th>
          <th className="py-1 pr-2 font-medium">Person</th>
          <th className="py-1 pr-2 font-medium">Due (UTC)</th>
          <th className="py-1 font-medium">Decision</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-stone-100">
        {reviews.map((r) => {
          const open = r.decision === null;
          const overdue = open && r.activatedAt !== null && r.dueAt !== null && r.dueAt < now;
          return (
            <tr key={r.id} className="align-top">
              <td className="py-1.5 pr-2 tabular-nums">
                {r.round} · {r.step}
              </td>
              <td className="py-1.5 pr-2">
                {r.name}
                <span className="block text-xs text-stone-500">{r.role === "approver" ? "Approver" : "Reviewer"}</span>
              </td>
              <td className="py-1.5 pr-2 whitespace-nowrap">
                {formatDate(r.dueAt, "when its turn comes")}
                {overdue && (
                  <span className="flex items-center gap-1 font-medium text-red-800">
                    <AlarmClock className="h-3.5 w-3.5" aria-hidden="true" /> Overdue
                  </span>
                )}
              </td>
              <td className="py-1.5">
                {open ? (r.activatedAt ? "Waiting for them" : "Waiting for an earlier step") : DECISION_WORDS[r.decision!]}
                {r.comment && <span className="block text-xs text-stone-700">“{r.comment}”</span>}
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
