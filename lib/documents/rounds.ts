import type { RoutingMode } from "@/db/enums";

interface Review {
  round: number;
  step: number;
  role: "reviewer" | "approver";
  assigneeId: string;
  name: string;
  decision: string | null;
  comment: string | null;
  decidedAt: string | null;
}

/** The comment that returned the draft to its author in the last round, or null when it was never returned. */
export function lastReturn(reviews: Review[]) {
  const returned = reviews
    .filter((r) => (r.decision === "sent_back" || r.decision === "rejected") && r.comment)
    .sort((a, b) => b.round - a.round || (b.decidedAt ?? "").localeCompare(a.decidedAt ?? ""));
  const last = returned[0];
  return last
    ? {
        round: last.round,
        by: last.name,
        decision: last.decision as "sent_back" | "rejected",
        comment: last.comment!,
        at: last.decidedAt,
      }
    : null;
}

/**
 * The routing of the last round, for a resubmission to start from: the reviewers in the
 * order they signed (the step order in a sequence), the approver and the routing mode.
 */
export function previousRouting(
  reviews: Review[],
  routing: RoutingMode | null,
): { reviewerIds: string[]; approverId: string | null; routing: RoutingMode } | null {
  const lastRound = Math.max(0, ...reviews.map((r) => r.round));
  if (lastRound === 0) return null;
  const round = reviews.filter((r) => r.round === lastRound);
  return {
    reviewerIds: round
      .filter((r) => r.role === "reviewer")
      .sort((a, b) => a.step - b.step)
      .map((r) => r.assigneeId),
    approverId: round.find((r) => r.role === "approver")?.assigneeId ?? null,
    routing: routing ?? "sequence",
  };
}
