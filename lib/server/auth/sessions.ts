import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, userRoles, type Role } from "@/db/schema";
import { env } from "@/lib/env";
import { unlessUnavailable } from "@/lib/server/errors";
import type { Tx } from "@/db/client";
import { lucia } from "@/lib/auth/lucia";
import { blankSessionCookie, sessionCookie } from "@/lib/auth/session-cookie";
import { generateSessionToken, sessionIdFromToken } from "@/lib/auth/session-token";
import { extendedExpiry, sessionState, type SessionPolicy } from "@/lib/auth/session-policy";

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  mustChangePassword: boolean;
  sessionId: string;
}

export function sessionPolicy(): SessionPolicy {
  const { SESSION_IDLE_MINUTES, SESSION_ABSOLUTE_MINUTES } = env();
  return { idleMs: SESSION_IDLE_MINUTES * 60_000, absoluteMs: SESSION_ABSOLUTE_MINUTES * 60_000 };
}

/**
 * Stores a new session under the hash of a fresh token and returns the token for
 * the cookie. Pass the caller's transaction to issue it atomically with the check
 * that allowed it (sign-in).
 */
export async function createSession(userId: string, now = new Date(), tx?: Tx) {
  const token = generateSessionToken();
  const id = sessionIdFromToken(token);
  const seconds = Math.floor(now.getTime() / 1000);
  await (tx ?? getDb()).insert(sessions).values({
    id,
    userId,
    createdAt: seconds,
    expiresAt: seconds + env().SESSION_IDLE_MINUTES * 60,
  });
  return { id, token };
}

function secureCookies() {
  const config = env();
  return config.NODE_ENV === "production" && config.APP_URL.startsWith("https:");
}
export const cookieForSession = (token: string) => sessionCookie(token, secureCookies());
export const cookieForSignOut = () => blankSessionCookie(secureCookies());

/**
 * Validates the token from the cookie: lucia checks the stored expiry of the
 * session stored under the token's hash; here we add the absolute lifetime, a
 * precise idle timeout, and the user's current state.
 * Returns null (and removes the session) when it may no longer be used.
 */
export async function validateSession(
  token: string,
  now = new Date(),
): Promise<SessionUser | null> {
  if (!token || token.length > 200) return null;
  const { session, user } = await lucia().validateSession(sessionIdFromToken(token));
  if (!session || !user) return null;
  const times = { createdAt: new Date(session.createdAt * 1000), expiresAt: session.expiresAt };
  const policy = sessionPolicy();
  // Both writes are bookkeeping: with a read-only database the refusal and the read still stand.
  if (sessionState(times, now, policy) !== "active" || !user.active) {
    await unlessUnavailable(() => lucia().invalidateSession(session.id));
    return null;
  }
  const next = extendedExpiry(times, now, policy);
  if (next) {
    await unlessUnavailable(() =>
      getDb()
        .update(sessions)
        .set({ expiresAt: Math.floor(next.getTime() / 1000) })
        .where(eq(sessions.id, session.id)),
    );
  }
  const roles = await getDb()
    .select({ role: userRoles.role })
    .from(userRoles)
    .where(eq(userRoles.userId, user.id));
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    roles: roles.map((r) => r.role),
    mustChangePassword: user.mustChangePassword,
    /** The stored (hashed) id, for ending this session or keeping it when others end. */
    sessionId: session.id,
  };
}

export async function invalidateSession(sessionId: string) {
  await lucia().invalidateSession(sessionId);
}

export async function invalidateUserSessions(userId: string) {
  await lucia().invalidateUserSessions(userId);
}
