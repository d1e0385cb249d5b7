import { AlarmClock } from "lucide-react";
import type { DocumentReview } from "@/db/schema";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

const DECISION_WORDS = {
  reviewed: "Reviewed",
  sent_back: "Sent back",
  approved: "Approved",
  rejected: "Rejected",
  withdrawn: "Withdrawn (round closed)",
} as const;

/** Who the version was routed to, round by round, with due dates and decisions. */
export function RoutingTable({
  reviews,
  now,
}: {
  reviews: (DocumentReview & { name: string })[];
  now: string;
}) {
  if (reviews.length === 0) return <p className="text-sm text-stone-600">Not routed yet.</p>;
  return (
    <Table density="compact" caption="Review routing">
      <THead>
        <Th>Round · step</Th>
        <Th>Person</Th>
        <Th>Due (UTC)</Th>
        <Th>Decision</Th>
      </THead>
      <TBody>
        {reviews.map((r) => {
          const open = r.decision === null;
          const overdue = open && r.activatedAt !== null && r.dueAt !== null && r.dueAt < now;
          return (
            <tr key={r.id} className="align-top">
              <Td className="tabular-nums">
                {r.round} · {r.step}
              </Td>
              <Td>
                {r.name}
                <span className="block text-xs text-stone-500">
                  {r.role === "approver" ? "Approver" : "Reviewer"}
                </span>
              </Td>
              <Td className="whitespace-nowrap">
                {formatDate(r.dueAt, "when its turn comes")}
                {overdue && (
                  <span className="flex items-center gap-1 font-medium text-red-800">
                    <AlarmClock className="h-3.5 w-3.5" aria-hidden="true" /> Overdue
                  </span>
                )}
              </Td>
              <Td>
                {open
                  ? r.activatedAt
                    ? "Waiting for them"
                    : "Waiting for an earlier step"
                  : DECISION_WORDS[r.decision!]}
                {r.comment && <span className="block text-xs text-stone-700">“{r.comment}”</span>}
              </Td>
            </tr>
          );
        })}
      </TBody>
    </Table>
  );
}
