import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { env } from "@/lib/env";
import { afterFailedAttempt, isLocked, type LockoutPolicy } from "@/lib/auth/lockout";
import { dummyPasswordHash, verifyPassword } from "@/lib/auth/password";
import { createSession } from "./sessions";

/** One message for every failure, so a caller cannot learn which e-mails exist or are locked. */
export const SIGN_IN_FAILED = "The e-mail or password is not correct, or the account is locked. Try again or ask an administrator.";

export type SignInResult =
  | { ok: true; userId: string; sessionId: string; mustChangePassword: boolean }
  | { ok: false; message: string };

export function lockoutPolicy(): LockoutPolicy {
  const { LOCKOUT_THRESHOLD, LOCKOUT_MINUTES } = env();
  return { threshold: LOCKOUT_THRESHOLD, windowMs: LOCKOUT_MINUTES * 60_000 };
}

export async function signIn(input: { email: string; password: string }, now = new Date()): Promise<SignInResult> {
  const db = getDb();
  const email = input.email.trim().toLowerCase();
  const [user] = await db.select().from(users).where(eq(users.email, email));
  if (!user) {
    await verifyPassword(await dummyPasswordHash(), input.password);
    return { ok: false, message: SIGN_IN_FAILED };
  }
  const locked = isLocked(user, now);
  // Verify even when locked so timing does not reveal the lock.
  const passwordOk = await verifyPassword(user.passwordHash, input.password);

  if (!locked && passwordOk && user.active) {
    await db.transaction(async (tx) => {
      await tx.update(users).set({ failedAttempts: 0, lockedUntil: null }).where(eq(users.id, user.id));
      await appendAudit(tx, { id: user.id, name: user.name }, { eventType: "auth.signed_in", recordType: "user", recordId: user.id }, now);
    });
    const session = await createSession(user.id, now);
    return { ok: true, userId: user.id, sessionId: session.id, mustChangePassword: user.mustChangePassword };
  }

  await recordFailedAttempt(user.id, "sign_in", now);
  return { ok: false, message: SIGN_IN_FAILED };
}

/**
 * Counts a failed password (at sign-in or when signing a record), locks the
 * account at the threshold, and audits both. The user row is re-read inside the
 * write transaction so concurrent failures are all counted.
 */
export async function recordFailedAttempt(userId: string, during: "sign_in" | "signing", now = new Date()) {
  await getDb().transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(eq(users.id, userId));
    if (!user) return;
    const actor = { id: user.id, name: user.name };
    const locked = isLocked(user, now);
    const reason = !user.active ? "account deactivated" : locked ? "account locked" : "wrong password";
    await appendAudit(tx, actor, { eventType: "auth.sign_in_failed", recordType: "user", recordId: user.id, new: { reason, during } }, now);
    if (!user.active || locked) return;
    const next = afterFailedAttempt(user, now, lockoutPolicy());
    await tx.update(users).set({ failedAttempts: next.failedAttempts, lockedUntil: next.lockedUntil }).where(eq(users.id, user.id));
    if (next.locked) {
      await appendAudit(tx, actor, { eventType: "auth.locked_out", recordType: "user", recordId: user.id, new: { lockedUntil: next.lockedUntil, attempts: lockoutPolicy().threshold } }, now);
    }
  });
}
