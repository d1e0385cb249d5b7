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

/**
 * Sends every due message once. Runs after a step commits and on a timer
 * (instrumentation.ts); concurrent calls share one pass so nothing is sent twice.
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
    .where(and(eq(emailOutbox.status, "pending"), lte(emailOutbox.nextAttemptAt, now.toISOString())))
    .orderBy(asc(emailOutbox.createdAt))
    .limit(50);
  let sent = 0;
  let failed = 0;
  for (const message of due) {
    try {
      await mailer().sendMail({
        from: env().MAIL_FROM,
        to: message.to,
        subject: message.subject,
        text: message.text,
        html: message.html ?? undefined,
      });
      await db.update(emailOutbox).set({ status: "sent", sentAt: new Date().toISOString(), attempts: message.attempts + 1, lastError: null }).where(eq(emailOutbox.id, message.id));
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
