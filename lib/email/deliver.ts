import { and, asc, eq, lte } from "drizzle-orm";
import { after } from "next/server";
import nodemailer, { type Transporter } from "nodemailer";
import { getDb } from "@/db/client";
import { emailOutbox } from "@/db/schema";
import { env } from "@/lib/env";
import { MAX_ATTEMPTS, nextAttemptDelayMs } from "./outbox";

let transport: Transporter | undefined;
function mailer() {
  transport ??= nodemailer.createTransport(env().SMTP_URL);
  return transport;
}

let running: Promise<{ sent: number; failed: number }> | null = null;

/** How long a claimed message is left to the pass that claimed it before another may retry it. */
const CLAIM_LEASE_MS = 5 * 60_000;

/**
 * Sends every due message once. Runs after a step commits and on a timer
 * (instrumentation.ts); concurrent calls in one module share one pass, and each
 * message is claimed in the database before it is sent, so nothing is sent twice.
 */
export function deliverDueEmails(now = new Date()) {
  running ??= deliver(now).finally(() => {
    running = null;
  });
  return running;
}

async function deliver(now: Date) {
  const db = getDb();
  const due = await db
    .select()
    .from(emailOutbox)
    .where(
      and(eq(emailOutbox.status, "pending"), lte(emailOutbox.nextAttemptAt, now.toISOString())),
    )
    .orderBy(asc(emailOutbox.createdAt))
    .limit(50);
  let sent = 0;
  let failed = 0;
  for (const message of due) {
    // Claim the message first: a timer and an action may each run a pass (Next bundles them
    // apart, so they share no memory), and so may another server. Only the pass whose claim
    // changed the row sends it; the lease keeps the others off it while it is on its way.
    const claimed = await db
      .update(emailOutbox)
      .set({
        attempts: message.attempts + 1,
        nextAttemptAt: new Date(now.getTime() + CLAIM_LEASE_MS).toISOString(),
      })
      .where(
        and(
          eq(emailOutbox.id, message.id),
          eq(emailOutbox.status, "pending"),
          eq(emailOutbox.attempts, message.attempts),
        ),
      )
      .returning({ id: emailOutbox.id });
    if (claimed.length === 0) continue;
    try {
      await mailer().sendMail({
        from: env().MAIL_FROM,
        to: message.to,
        subject: message.subject,
        text: message.text,
        html: message.html ?? undefined,
      });
      await db
        .update(emailOutbox)
        .set({
          status: "sent",
          sentAt: new Date().toISOString(),
          attempts: message.attempts + 1,
          lastError: null,
        })
        .where(eq(emailOutbox.id, message.id));
      sent += 1;
    } catch (error) {
      const attempts = message.attempts + 1;
      await db
        .update(emailOutbox)
        .set({
          attempts,
          status: attempts >= MAX_ATTEMPTS ? "failed" : "pending",
          lastError: String(error instanceof Error ? error.message : error).slice(0, 500),
          nextAttemptAt: new Date(now.getTime() + nextAttemptDelayMs(attempts)).toISOString(),
        })
        .where(eq(emailOutbox.id, message.id));
      failed += 1;
    }
  }
  return { sent, failed };
}

/** For actions and route handlers: deliver after the response, so the user neither waits nor fails. */
export function deliverSoon() {
  after(() => deliverDueEmails().catch((error) => console.error("e-mail delivery failed", error)));
}
