import "server-only";
import { z } from "zod";
import type { SessionUser } from "@/lib/server/auth/sessions";
import { documentQueueProvider } from "@/lib/server/documents/queue-provider";
import { bathQueueProvider } from "@/lib/server/bath/queue-provider";
import { bathLimitsQueueProvider } from "@/lib/server/bath/limits-queue-provider";
import { evidenceQueueProvider } from "@/lib/server/evidence/queue-provider";
import { changeQueueProvider } from "@/lib/server/changes/queue-provider";
import { deviationQueueProvider } from "@/lib/server/deviations/queue-provider";
import { nonconformanceQueueProvider } from "@/lib/server/nonconformances/queue-provider";
import { emergencyQueueProvider } from "@/lib/server/changes/emergency-queue-provider";
import { controlPlanQueueProvider } from "@/lib/server/control-plans/queue-provider";
import { instrumentQueueProvider } from "@/lib/server/instruments/queue-provider";
import { trainingQueueProvider } from "@/lib/server/training/queue-provider";
import type { QueueItem, QueueProvider, QueueWindow } from "./types";

/**
 * Features register their providers here (documents: reviews and approvals;
 * evidence: tests to perform or verify, bath maintenance; changes: steps to act on).
 */
const PROVIDERS: QueueProvider[] = [
  documentQueueProvider,
  evidenceQueueProvider,
  bathQueueProvider,
  bathLimitsQueueProvider,
  changeQueueProvider,
  deviationQueueProvider,
  nonconformanceQueueProvider,
  emergencyQueueProvider,
  controlPlanQueueProvider,
  instrumentQueueProvider,
  trainingQueueProvider,
];

export const QUEUE_PAGE_SIZE = 50;

export interface QueueEntry extends QueueItem {
  overdue: boolean;
}

/** `?kind=…&page=…` of GET /api/queue: one kind's further pages; without a kind, the first page of every kind. */
export const queueQuery = z.strictObject({
  kind: z.string().trim().min(1).max(80).optional(),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
});
export type QueueQuery = z.input<typeof queueQuery>;

export interface QueuePage {
  items: QueueEntry[];
  /** Every kind with items waiting, with how many in all: a page shows at most QUEUE_PAGE_SIZE of each. */
  kinds: { kind: string; total: number }[];
  kind: string | null;
  page: number;
  pageSize: number;
}

const byDue = (a: QueueItem, b: QueueItem) => (a.due ?? "9999").localeCompare(b.due ?? "9999");

/** Everything waiting for the user, paged per kind: overdue first, then by due date, undated last. */
export async function getQueue(
  user: SessionUser,
  query: QueueQuery = {},
  now = new Date(),
): Promise<QueuePage> {
  const { kind, page } = queueQuery.parse(query);
  const pageSize = QUEUE_PAGE_SIZE;
  const window = (k: string): QueueWindow => ({
    offset: k === kind ? (page - 1) * pageSize : 0,
    limit: pageSize,
  });
  const results = await Promise.all(PROVIDERS.map((p) => p(user, now, window)));

  const totals = new Map<string, number>();
  const items: QueueItem[] = [];
  for (const result of results) {
    const byKind = new Map<string, QueueItem[]>();
    for (const item of result.items) {
      const list = byKind.get(item.kind);
      if (list) list.push(item);
      else byKind.set(item.kind, [item]);
    }
    for (const [k, list] of byKind) {
      const pagedAlready = result.totals?.[k] !== undefined;
      if (!pagedAlready) {
        const { offset, limit } = window(k);
        totals.set(k, list.length);
        items.push(...list.sort(byDue).slice(offset, offset + limit));
      } else items.push(...list);
    }
    for (const [k, n] of Object.entries(result.totals ?? {})) if (n > 0) totals.set(k, n);
  }
  const iso = now.toISOString();
  return {
    items: items
      .filter((item) => kind === undefined || item.kind === kind)
      .map((item) => ({ ...item, overdue: item.due !== null && item.due < iso }))
      .sort(byDue),
    kinds: [...totals]
      .map(([k, total]) => ({ kind: k, total }))
      .sort((a, b) => a.kind.localeCompare(b.kind)),
    kind: kind ?? null,
    page,
    pageSize,
  };
}
