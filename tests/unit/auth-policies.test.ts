import { describe, expect, it } from "vitest";
import { afterFailedAttempt, isLocked } from "@/lib/auth/lockout";
import { extendedExpiry, sessionState } from "@/lib/auth/session-policy";

const policy = { threshold: 5, windowMs: 15 * 60_000 };
const t0 = new Date("2026-01-05T08:00:00.000Z");
const at = (minutes: number) => new Date(t0.getTime() + minutes * 60_000);

describe("lockout", () => {
  it("locks at the fifth failure and not before", () => {
    let state = { failedAttempts: 0, lockedUntil: null as string | null };
    for (let i = 1; i <= 4; i++) {
      const next = afterFailedAttempt(state, at(i), policy);
      expect(next.locked).toBe(false);
      state = next;
    }
    expect(state.failedAttempts).toBe(4);
    const fifth = afterFailedAttempt(state, at(5), policy);
    expect(fifth.locked).toBe(true);
    expect(fifth.lockedUntil).toBe(at(20).toISOString());
    expect(isLocked(fifth, at(19.99))).toBe(true);
  });

  it("releases after the window and counts afresh", () => {
    const locked = { failedAttempts: 0, lockedUntil: at(15).toISOString() };
    expect(isLocked(locked, at(15))).toBe(false);
    const next = afterFailedAttempt(locked, at(16), policy);
    expect(next).toEqual({ failedAttempts: 1, lockedUntil: null, locked: false });
  });
});

describe("session timing", () => {
  const p = { idleMs: 30 * 60_000, absoluteMs: 12 * 60 * 60_000 };
  it("expires after the idle period without activity", () => {
    const s = { createdAt: t0, expiresAt: at(30) };
    expect(sessionState(s, at(29), p)).toBe("active");
    expect(sessionState(s, at(30), p)).toBe("idle_expired");
  });
  it("expires at the absolute lifetime even while active", () => {
    const s = { createdAt: t0, expiresAt: at(12 * 60 + 20) };
    expect(sessionState(s, at(12 * 60), p)).toBe("absolute_expired");
  });
  it("extends on activity, never past the absolute lifetime", () => {
    expect(extendedExpiry({ createdAt: t0, expiresAt: at(30) }, at(10), p)).toEqual(at(40));
    expect(extendedExpiry({ createdAt: t0, expiresAt: at(30) }, at(0.5), p)).toBeNull();
    expect(extendedExpiry({ createdAt: t0, expiresAt: at(710) }, at(700), p)).toEqual(at(720));
  });
});
