import "server-only";
import { can } from "@/lib/auth/permissions";
import { MAINTENANCE_LABELS, STATE_LABELS } from "@/lib/evidence/maintenance";
import type { QueueProvider } from "@/lib/server/queue/types";
import { listMaintenance } from "./queries";
import { formatDate } from "@/lib/format/date";

/** Bath changes, filter changes and readings that are due or overdue, for those who keep the log. */
export const bathQueueProvider: QueueProvider = async (user, now) => {
  if (!can(user.roles, "bath.record")) return { items: [] };
  const items = (await listMaintenance(now))
    .filter((m) => m.status.state !== "ok")
    .map((m) => ({
      id: `maintenance:${m.intervalId}`,
      kind: MAINTENANCE_LABELS[m.kind],
      title: `${m.system} · ${m.tank}`,
      detail: `${STATE_LABELS[m.status.state]}: every ${m.intervalDays} days; last ${formatDate(m.status.lastDoneAt, "never recorded")}`,
      href: `/evidence/bath/${m.stageId}`,
      due: m.status.dueAt,
    }));
  return { items };
};
