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

/** Each feature contributes the items it knows about for this user. */
export type QueueProvider = (user: SessionUser, now: Date) => Promise<QueueItem[]>;
