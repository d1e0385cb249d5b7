import type { Tx } from "@/db/client";
import { emailOutbox } from "@/db/schema";

export interface EmailMessage {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

/**
 * Queues a message in the caller's transaction: it exists only if the step that
 * caused it commits, and it is sent afterwards (a failed send never undoes a step).
 */
export async function enqueueEmail(tx: Tx, message: EmailMessage, now = new Date()) {
  const [row] = await tx
    .insert(emailOutbox)
    .values({ ...message, html: message.html ?? null, nextAttemptAt: now.toISOString() })
    .returning({ id: emailOutbox.id });
  return row.id;
}

/** Retry schedule: 1, 2, 4, 8, 16 minutes, then the message is marked failed for an admin to see. */
export const MAX_ATTEMPTS = 6;
export function nextAttemptDelayMs(attempts: number): number {
  return 60_000 * 2 ** Math.max(0, attempts - 1);
}
