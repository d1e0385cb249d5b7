import type { SessionUser } from "@/lib/server/auth/sessions";

/** One thing waiting for the signed-in user, from any feature. */
export interface QueueItem {
  id: string;
  /** What kind of work: shown as a word, e.g. "Review", "Approval", "Bath change". */
  kind: string;
  title: string;
  detail: string;
  href: string;
  /** ISO date-time, or null when there is no due date. */
  due: string | null;
}

/** Which slice of one kind's items to return: the requested page for the kind asked for, the first page for the others. */
export interface QueueWindow {
  offset: number;
  limit: number;
}

export interface QueueProviderResult {
  items: QueueItem[];
  /**
   * Totals for the kinds the provider already paged in the database (their `items` are then
   * only the window). Kinds missing here are counted and paged by getQueue from `items`.
   */
  totals?: Record<string, number>;
}

/** Each feature contributes the items it knows about for this user; `window` lets a long list be paged where it is read. */
export type QueueProvider = (
  user: SessionUser,
  now: Date,
  window?: (kind: string) => QueueWindow,
) => Promise<QueueProviderResult>;
