/**
 * Per-address throttle for sign-in, pure. An address that keeps failing is refused
 * for a while before any account's counter moves, so one stranger cannot lock
 * accounts at will; the account lockout (lockout.ts) still stops a spread-out guesser.
 */
export interface ThrottlePolicy {
  /** Failures allowed within the window; the next one blocks the address. */
  limit: number;
  windowMs: number;
  blockMs: number;
}

export interface ThrottleState {
  failures: number;
  windowStartedAt: string;
  blockedUntil: string | null;
}

export function isBlocked(state: ThrottleState | undefined, now: Date): boolean {
  return !!state?.blockedUntil && new Date(state.blockedUntil).getTime() > now.getTime();
}

/** The state after one more failure from the address. */
export function afterAddressFailure(
  state: ThrottleState | undefined,
  now: Date,
  policy: ThrottlePolicy,
): ThrottleState {
  const windowOver =
    !state || now.getTime() - new Date(state.windowStartedAt).getTime() >= policy.windowMs;
  const failures = windowOver ? 1 : state.failures + 1;
  const windowStartedAt = windowOver ? now.toISOString() : state.windowStartedAt;
  if (failures >= policy.limit) {
    // A new window starts when the block ends, so the address gets its full allowance back then.
    const until = new Date(now.getTime() + policy.blockMs).toISOString();
    return { failures: 0, windowStartedAt: until, blockedUntil: until };
  }
  return {
    failures,
    windowStartedAt,
    blockedUntil: isBlocked(state, now) ? state!.blockedUntil : null,
  };
}

/**
 * The client's address from X-Forwarded-For. Each proxy appends the address it saw,
 * so with `hops` trusted proxies the entry `hops` from the right is the one the
 * outermost trusted proxy wrote; entries further left are the client's own claim.
 * With no proxy, Next.js fills the header from the socket only when the client sent
 * none, so the rightmost entry is the best there is (see README).
 */
export function sourceAddress(forwardedFor: string | null, hops: number): string | null {
  const entries = (forwardedFor ?? "")
    .split(",")
    .map((e) => e.trim())
    .filter(Boolean);
  if (entries.length === 0) return null;
  const index = entries.length - Math.max(1, hops);
  const entry = entries[Math.max(0, index)];
  // Bounded, so a hostile header cannot fill the table with huge keys.
  return entry.slice(0, 100).toLowerCase();
}
