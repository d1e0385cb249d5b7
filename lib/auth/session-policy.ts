/** Session timing rules, kept pure so they can be tested without a clock or a database. */
export interface SessionPolicy {
  idleMs: number;
  absoluteMs: number;
}

export interface SessionTimes {
  createdAt: Date;
  expiresAt: Date;
}

export type SessionState = "active" | "idle_expired" | "absolute_expired";

export function sessionState(s: SessionTimes, now: Date, policy: SessionPolicy): SessionState {
  if (now.getTime() >= s.createdAt.getTime() + policy.absoluteMs) return "absolute_expired";
  if (now.getTime() >= s.expiresAt.getTime()) return "idle_expired";
  return "active";
}

/**
 * The expiry after activity at `now`: a full idle period from now, never past the
 * absolute lifetime. Null when the stored expiry is recent enough (saves a write
 * per request; the idle timeout is then exact to within a minute).
 */
export function extendedExpiry(s: SessionTimes, now: Date, policy: SessionPolicy): Date | null {
  const target = Math.min(now.getTime() + policy.idleMs, s.createdAt.getTime() + policy.absoluteMs);
  return target - s.expiresAt.getTime() > 60_000 ? new Date(target) : null;
}
