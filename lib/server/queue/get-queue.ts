import "server-only";
import type { SessionUser } from "@/lib/server/auth/sessions";
import { documentQueueProvider } from "@/lib/server/documents/queue-provider";
import { bathQueueProvider } from "@/lib/server/bath/queue-provider";
import { evidenceQueueProvider } from "@/lib/server/evidence/queue-provider";
import { changeQueueProvider } from "@/lib/server/changes/queue-provider";
import type { QueueItem, QueueProvider } from "./types";

/**
 * Features register their providers here (documents: reviews and approvals;
 * evidence: tests to perform or verify, bath maintenance; changes: steps to act on).
 */
const PROVIDERS: QueueProvider[] = [documentQueueProvider, evidenceQueueProvider, bathQueueProvider, changeQueueProvider];

export interface QueueEntry extends QueueItem {
  overdue: boolean;
}

/** Everything waiting for the user: overdue first, then by due date, undated last. */
export async function getQueue(user: SessionUser, now = new Date()): Promise<QueueEntry[]> {
  const lists = await Promise.all(PROVIDERS.map((p) => p(user, now)));
  return lists
    .flat()
    .map((item) => ({ ...item, overdue: item.due !== null && item.due < now.toISOString() }))
    .sort((a, b) => (a.due ?? "9999").localeCompare(b.due ?? "9999"));
}
