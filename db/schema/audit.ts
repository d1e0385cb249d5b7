import { index, integer, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { SIGNATURE_MEANINGS, SIGNED_RECORD_TYPES } from "../enums";
import { id } from "./columns";
import { users } from "./people";

// ── Signatures and audit ──────────────────────────────────────────────────

export const signatures = sqliteTable(
  "signatures",
  {
    id: id(),
    recordType: text("record_type", { enum: SIGNED_RECORD_TYPES }).notNull(),
    recordId: text("record_id").notNull(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    /** The name as printed at the moment of signing (§11.50). */
    printedName: text("printed_name").notNull(),
    meaning: text("meaning", { enum: SIGNATURE_MEANINGS }).notNull(),
    signedAt: text("signed_at").notNull(),
    /** SHA-256 of exactly the record version signed (§11.70). */
    contentHash: text("content_hash").notNull(),
  },
  (t) => [
    index("signatures_record_idx").on(t.recordType, t.recordId),
    // A version returned to draft and resubmitted is new content: the same person may sign it again.
    uniqueIndex("signatures_once_per_content_uq").on(
      t.recordType,
      t.recordId,
      t.userId,
      t.meaning,
      t.contentHash,
    ),
  ],
);
export type Signature = typeof signatures.$inferSelect;

/** Append-only; triggers in the migrations refuse UPDATE and DELETE. */
export const auditEvents = sqliteTable(
  "audit_events",
  {
    seq: integer("seq").primaryKey({ autoIncrement: true }),
    at: text("at").notNull(),
    actorId: text("actor_id"),
    actorName: text("actor_name").notNull(),
    /** The event type (lib/audit/events.ts). The column keeps its first name: every row's hash covers it. */
    action: text("action").notNull(),
    recordType: text("record_type").notNull(),
    recordId: text("record_id").notNull(),
    /** Canonical JSON text, exactly as hashed. */
    oldValue: text("old_value"),
    newValue: text("new_value"),
    reason: text("reason"),
    prevHash: text("prev_hash").notNull(),
    hash: text("hash").notNull(),
  },
  (t) => [
    index("audit_record_idx").on(t.recordType, t.recordId),
    index("audit_actor_idx").on(t.actorId),
    index("audit_at_idx").on(t.at),
  ],
);
export type AuditEventRow = typeof auditEvents.$inferSelect;
