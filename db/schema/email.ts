import { sql } from "drizzle-orm";
import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { createdAt, id } from "./columns";

// ── Outgoing e-mail ───────────────────────────────────────────────────────

export const emailOutbox = sqliteTable(
  "email_outbox",
  {
    id: id(),
    to: text("to").notNull(),
    subject: text("subject").notNull(),
    text: text("text").notNull(),
    html: text("html"),
    status: text("status", { enum: ["pending", "sent", "failed"] })
      .notNull()
      .default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: text("next_attempt_at")
      .notNull()
      .default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`),
    lastError: text("last_error"),
    createdAt: createdAt(),
    sentAt: text("sent_at"),
  },
  (t) => [index("email_outbox_due_idx").on(t.status, t.nextAttemptAt)],
);
export type OutboxMessage = typeof emailOutbox.$inferSelect;
