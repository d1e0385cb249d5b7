import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, userRoles, type Role } from "@/db/schema";
import { env } from "@/lib/env";
import { lucia } from "@/lib/auth/lucia";
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

export async function createSession(userId: string, now = new Date()) {
  return lucia().createSession(userId, { createdAt: Math.floor(now.getTime() / 1000) });
}

/**
 * Validates a session id: lucia checks the stored expiry; here we add the
 * absolute lifetime, a precise idle timeout, and the user's current state.
 * Returns null (and removes the session) when it may no longer be used.
 */
export async function validateSession(sessionId: string, now = new Date()): Promise<SessionUser | null> {
  const { session, user } = await lucia().validateSession(sessionId);
  if (!session || !user) return null;
  const times = { createdAt: new Date(session.createdAt * 1000), expiresAt: session.expiresAt };
  const policy = sessionPolicy();
  if (sessionState(times, now, policy) !== "active" || !user.active) {
    await lucia().invalidateSession(session.id);
    return null;
  }
  const next = extendedExpiry(times, now, policy);
  if (next) {
    await getDb()
      .update(sessions)
      .set({ expiresAt: Math.floor(next.getTime() / 1000) })
      .where(eq(sessions.id, session.id));
  }
  const roles = await getDb().select({ role: userRoles.role }).from(userRoles).where(eq(userRoles.userId, user.id));
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    roles: roles.map((r) => r.role),
    mustChangePassword: user.mustChangePassword,
    sessionId: session.id,
  };
}

export async function invalidateSession(sessionId: string) {
  await lucia().invalidateSession(sessionId);
}

export async function invalidateUserSessions(userId: string) {
  await lucia().invalidateUserSessions(userId);
}
