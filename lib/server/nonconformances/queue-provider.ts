import "server-only";
import { can } from "@/lib/auth/permissions";
import { NC_STATUS_LABELS, NEXT_STEP_LABELS } from "@/lib/nonconformances/lifecycle";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { formatDate } from "@/lib/format/date";
import { openNcWork } from "./queries";

/**
 * Nonconformance work for this user: the NCs they own (and unowned ones, for every engineer,
 * so a failure raised by itself is picked up), closures waiting for an approver, and their actions.
 */
export const nonconformanceQueueProvider: QueueProvider = async (user) => {
  const works = can(user.roles, "nc.work");
  const approves = can(user.roles, "nc.approve");
  const { open, actions } = await openNcWork();
  const items: QueueItem[] = [];
  const byId = new Map(open.map((n) => [n.id, n]));
  for (const nc of open) {
    const title = `${nc.number} ${nc.title}`;
    const href = `/nonconformances/${nc.id}`;
    if (works && (nc.ownerId === user.id || nc.ownerId === null))
      items.push({
        id: `nc:${nc.id}`,
        kind: nc.ownerId ? "Nonconformance" : "Nonconformance to take on",
        title,
        detail: `${NC_STATUS_LABELS[nc.status]}${NEXT_STEP_LABELS[nc.status] ? ` · next: ${NEXT_STEP_LABELS[nc.status]!.toLowerCase()}` : ""}`,
        href,
        due: nc.status === "effectiveness_check" ? nc.effectivenessDueOn : nc.dueOn,
      });
    if (approves && nc.status === "effectiveness_check" && nc.effectivenessResult === "confirmed")
      items.push({
        id: `nc:${nc.id}:closure`,
        kind: "Nonconformance closure",
        title,
        detail: "effectiveness confirmed: approve the closure once the engineer has signed",
        href,
        due: null,
      });
  }
  for (const { action } of actions) {
    if (action.ownerId !== user.id) continue;
    const nc = byId.get(action.nonconformanceId);
    if (!nc) continue;
    items.push({
      id: `nc-action:${action.id}`,
      kind: action.kind === "corrective" ? "Corrective action" : "Preventive action",
      title: `${nc.number} ${action.description}`,
      detail: `due ${formatDate(action.dueOn)}`,
      href: `/nonconformances/${nc.id}#actions`,
      due: action.dueOn,
    });
  }
  return { items };
};
