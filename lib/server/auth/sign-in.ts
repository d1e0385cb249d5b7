import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { signInThrottle, userRoles, users, type User } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { env } from "@/lib/env";
import { enqueueEmail } from "@/lib/email/outbox";
import { afterFailedAttempt, isLocked, type LockoutPolicy } from "@/lib/auth/lockout";
import { dummyPasswordHash, verifyPassword } from "@/lib/auth/password";
import { afterAddressFailure, isBlocked, type ThrottlePolicy } from "@/lib/auth/throttle";
import { accountLockedEmail } from "@/templates/email/account-locked";
import { createSession } from "./sessions";

/** One message for every failure, so a caller cannot learn which e-mails exist or are locked. */
export const SIGN_IN_FAILED =
  "The e-mail or password is not correct, or the account is locked. Try again or ask an administrator.";
/** Says nothing about any account: the address alone is being refused. */
export const SIGN_IN_THROTTLED =
  "Too many failed sign-ins from your network. Wait a few minutes and try again.";

export type SignInResult =
  | { ok: true; userId: string; sessionId: string; token: string; mustChangePassword: boolean }
  | { ok: false; message: string };

export function lockoutPolicy(): LockoutPolicy {
  const { LOCKOUT_THRESHOLD, LOCKOUT_MINUTES } = env();
  return { threshold: LOCKOUT_THRESHOLD, windowMs: LOCKOUT_MINUTES * 60_000 };
}

export function throttlePolicy(): ThrottlePolicy {
  const { SIGN_IN_ADDRESS_LIMIT, SIGN_IN_ADDRESS_WINDOW_MINUTES, SIGN_IN_ADDRESS_BLOCK_MINUTES } =
    env();
  return {
    limit: SIGN_IN_ADDRESS_LIMIT,
    windowMs: SIGN_IN_ADDRESS_WINDOW_MINUTES * 60_000,
    blockMs: SIGN_IN_ADDRESS_BLOCK_MINUTES * 60_000,
  };
}

async function throttleOf(db: Tx | Database, address: string) {
  const [row] = await db.select().from(signInThrottle).where(eq(signInThrottle.address, address));
  return row;
}

async function countAddressFailure(tx: Tx, address: string, now: Date) {
  const next = afterAddressFailure(await throttleOf(tx, address), now, throttlePolicy());
  await tx
    .insert(signInThrottle)
    .values({ address, ...next })
    .onConflictDoUpdate({ target: signInThrottle.address, set: next });
}

/**
 * Signs in. The argon2 check runs outside any transaction (it is slow); then one
 * write transaction re-reads the address throttle and the account and decides:
 * a session is inserted only if the account is, at that moment, neither locked nor
 * deactivated and its password unchanged. Write transactions are serialised, so a
 * lock committed by a parallel wrong guess is always seen: once the threshold is
 * crossed no session is issued, however many guesses race.
 *
 * `sourceAddress` is the client's address (see `sourceAddress()` in lib/auth/throttle);
 * without one (scripts, tests) no per-address throttle applies.
 */
export async function signIn(
  input: { email: string; password: string; sourceAddress?: string | null },
  now = new Date(),
): Promise<SignInResult> {
  const db = getDb();
  const email = input.email.trim().toLowerCase();
  const address = input.sourceAddress ?? null;
  // A blocked address is refused before the password is even hashed: cheap, and no account counter moves.
  if (address && isBlocked(await throttleOf(db, address), now))
    return { ok: false, message: SIGN_IN_THROTTLED };

  const [user] = await db.select().from(users).where(eq(users.email, email));
  if (!user) {
    await verifyPassword(await dummyPasswordHash(), input.password);
    if (address) {
      const throttled = await db.transaction(async (tx) => {
        if (isBlocked(await throttleOf(tx, address), now)) return true;
        await countAddressFailure(tx, address, now);
        return false;
      });
      if (throttled) return { ok: false, message: SIGN_IN_THROTTLED };
    }
    return { ok: false, message: SIGN_IN_FAILED };
  }
  // Verified even when locked so timing does not reveal the lock.
  const passwordOk = await verifyPassword(user.passwordHash, input.password);

  const outcome = await db.transaction(async (tx) => {
    if (address && isBlocked(await throttleOf(tx, address), now))
      return { kind: "throttled" as const };
    const [current] = await tx.select().from(users).where(eq(users.id, user.id));
    if (!current) return { kind: "failed" as const };
    const stillValid = current.passwordHash === user.passwordHash;
    if (passwordOk && stillValid && current.active && !isLocked(current, now)) {
      await tx
        .update(users)
        .set({ failedAttempts: 0, lockedUntil: null })
        .where(eq(users.id, current.id));
      await appendAudit(
        tx,
        { id: current.id, name: current.name },
        { eventType: "auth.signed_in", recordType: "user", recordId: current.id },
        now,
      );
      const session = await createSession(current.id, now, tx);
      return { kind: "ok" as const, session, mustChangePassword: current.mustChangePassword };
    }
    await countFailedAttempt(tx, current, "sign_in", now, address);
    if (address) await countAddressFailure(tx, address, now);
    return { kind: "failed" as const };
  });
  if (outcome.kind === "ok") {
    return {
      ok: true,
      userId: user.id,
      sessionId: outcome.session.id,
      token: outcome.session.token,
      mustChangePassword: outcome.mustChangePassword,
    };
  }
  return { ok: false, message: outcome.kind === "throttled" ? SIGN_IN_THROTTLED : SIGN_IN_FAILED };
}

export type FailedAttempt =
  | { state: "counted"; attemptsLeft: number }
  | { state: "locked_now" | "already_locked" | "inactive" };

/**
 * Counts a failed password (at sign-in or when signing a record) inside the
 * caller's write transaction, on the row as re-read there, so parallel failures
 * are all counted and the lock is decided in the same transaction as the check.
 * Locks the account at the threshold, audits both and queues an e-mail to the
 * administrators.
 */
export async function countFailedAttempt(
  tx: Tx,
  user: User,
  during: "sign_in" | "signing",
  now: Date,
  sourceAddress: string | null = null,
): Promise<FailedAttempt> {
  const actor = { id: user.id, name: user.name };
  const locked = isLocked(user, now);
  const reason = !user.active
    ? "account deactivated"
    : locked
      ? "account locked"
      : "wrong password";
  await appendAudit(
    tx,
    actor,
    {
      eventType: "auth.sign_in_failed",
      recordType: "user",
      recordId: user.id,
      new: { reason, during, ...(sourceAddress ? { sourceAddress } : {}) },
    },
    now,
  );
  if (!user.active) return { state: "inactive" };
  if (locked) return { state: "already_locked" };
  const policy = lockoutPolicy();
  const next = afterFailedAttempt(user, now, policy);
  await tx
    .update(users)
    .set({ failedAttempts: next.failedAttempts, lockedUntil: next.lockedUntil })
    .where(eq(users.id, user.id));
  if (!next.locked)
    return { state: "counted", attemptsLeft: policy.threshold - next.failedAttempts };
  await appendAudit(
    tx,
    actor,
    {
      eventType: "auth.locked_out",
      recordType: "user",
      recordId: user.id,
      new: { lockedUntil: next.lockedUntil, attempts: policy.threshold },
    },
    now,
  );
  const admins = await tx
    .select({ email: users.email })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(eq(userRoles.role, "admin"), eq(users.active, true)));
  const mail = accountLockedEmail({
    name: user.name,
    email: user.email,
    lockedUntil: next.lockedUntil!,
    attempts: policy.threshold,
    during,
    sourceAddress,
    userId: user.id,
  });
  for (const { email } of admins) await enqueueEmail(tx, { to: email, ...mail }, now);
  return { state: "locked_now" };
}

/** For callers outside a transaction (a wrong current password on the password form). */
export async function recordFailedAttempt(
  userId: string,
  during: "sign_in" | "signing",
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(eq(users.id, userId));
    return user ? countFailedAttempt(tx, user, during, now) : undefined;
  });
}
