import { index, integer, primaryKey, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { ROLES, API_TOKEN_SCOPES } from "../enums";
import { bool, createdAt, id } from "./columns";

// ── People and access ─────────────────────────────────────────────────────

export const users = sqliteTable("users", {
  id: id(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  jobTitle: text("job_title"),
  passwordHash: text("password_hash").notNull(),
  active: bool("active").notNull().default(true),
  failedAttempts: integer("failed_attempts").notNull().default(0),
  lockedUntil: text("locked_until"),
  mustChangePassword: bool("must_change_password").notNull().default(false),
  passwordChangedAt: text("password_changed_at"),
  createdAt: createdAt(),
});
export type User = typeof users.$inferSelect;

export const userRoles = sqliteTable(
  "user_roles",
  {
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    role: text("role", { enum: ROLES }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.userId, t.role] })],
);
export type UserRole = typeof userRoles.$inferSelect;

export const sessions = sqliteTable(
  "sessions",
  {
    /** SHA-256 (hex) of the token in the cookie: a copy of the database holds no usable session. */
    id: text("id").primaryKey(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    /** Unix seconds, as lucia's adapter writes it; moved forward on activity (idle timeout). */
    expiresAt: integer("expires_at").notNull(),
    /** Unix seconds; the absolute lifetime counts from here. */
    createdAt: integer("created_at").notNull(),
  },
  (t) => [index("sessions_user_idx").on(t.userId)],
);
export type Session = typeof sessions.$inferSelect;

/**
 * Failed sign-ins per source address. An address that keeps failing is refused
 * before any account's counter moves, so a stranger cannot lock people out at will.
 */
export const signInThrottle = sqliteTable("sign_in_throttle", {
  address: text("address").primaryKey(),
  failures: integer("failures").notNull().default(0),
  windowStartedAt: text("window_started_at").notNull(),
  blockedUntil: text("blocked_until"),
});
export type SignInThrottle = typeof signInThrottle.$inferSelect;

/** Earlier password hashes, so a user cannot cycle back to one of their last passwords. */
export const passwordHistory = sqliteTable(
  "password_history",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    passwordHash: text("password_hash").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("password_history_user_idx").on(t.userId, t.createdAt)],
);
export type PasswordHistoryRow = typeof passwordHistory.$inferSelect;

// ── API access ────────────────────────────────────────────────────────────

/**
 * A personal API token. Only its SHA-256 is stored; the token itself is shown once
 * at creation, and afterwards only its prefix identifies it. A token acts with its
 * owner's roles, never more, and a read token never writes.
 */
export const apiTokens = sqliteTable(
  "api_tokens",
  {
    id: id(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id),
    name: text("name").notNull(),
    /** The first characters of the token, enough to recognise it in a list. */
    prefix: text("prefix").notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    scope: text("scope", { enum: API_TOKEN_SCOPES }).notNull(),
    createdAt: createdAt(),
    lastUsedAt: text("last_used_at"),
    /** Chosen at creation; a token past it is refused. Null only on tokens made before expiry existed and not yet migrated. */
    expiresAt: text("expires_at"),
    revokedAt: text("revoked_at"),
    /** Set when the owner's password is reset or the owner is deactivated: the token stops working for good. */
    suspendedAt: text("suspended_at"),
    suspendedReason: text("suspended_reason"),
  },
  (t) => [index("api_tokens_user_idx").on(t.userId)],
);
export type ApiToken = typeof apiTokens.$inferSelect;
