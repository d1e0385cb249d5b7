/** Lockout rules (21 CFR 11.300(d): safeguards against attempts at unauthorised use), pure. */
export interface LockoutPolicy {
  threshold: number;
  windowMs: number;
}

export interface AttemptState {
  failedAttempts: number;
  lockedUntil: string | null;
}

export function isLocked(state: AttemptState, now: Date): boolean {
  return state.lockedUntil !== null && new Date(state.lockedUntil).getTime() > now.getTime();
}

/** The state after one more failed attempt; `locked` is true when this attempt triggered the lockout. */
export function afterFailedAttempt(state: AttemptState, now: Date, policy: LockoutPolicy) {
  // A lockout that has run out starts the count afresh.
  const expired = state.lockedUntil !== null && !isLocked(state, now);
  const failedAttempts = (expired ? 0 : state.failedAttempts) + 1;
  const locked = failedAttempts >= policy.threshold;
  return {
    failedAttempts: locked ? 0 : failedAttempts,
    lockedUntil: locked
      ? new Date(now.getTime() + policy.windowMs).toISOString()
      : expired
        ? null
        : state.lockedUntil,
    locked,
  };
}
