import { and, asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, emailOutbox, sessions, signInThrottle, users } from "@/db/schema";
import { verifyAuditChain } from "@/lib/audit";
import { sessionCookie } from "@/lib/auth/session-cookie";
import { afterAddressFailure, isBlocked, sourceAddress } from "@/lib/auth/throttle";
import { signIn, SIGN_IN_FAILED, SIGN_IN_THROTTLED } from "@/lib/server/auth/sign-in";
import { createSession, validateSession, cookieForSession } from "@/lib/server/auth/sessions";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { createUser } from "@/lib/server/users/create-user";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const setup = { id: null, name: "test setup" } as const;

beforeAll(async () => {
  t = await createTestDatabase();
});
afterAll(() => t.cleanup());

async function newUser(email: string, roles: ("engineer" | "admin")[] = ["engineer"]) {
  const { id, temporaryPassword } = await createUser(setup, {
    name: `User ${email}`,
    email,
    jobTitle: null,
    roles,
  });
  return { id, email, password: temporaryPassword };
}

async function eventsFor(userId: string) {
  return t.db
    .select()
    .from(auditEvents)
    .where(eq(auditEvents.recordId, userId))
    .orderBy(asc(auditEvents.seq));
}

describe("lockout under a parallel burst", () => {
  it("issues no session once the threshold (5, the default) is crossed: 39 wrong passwords and the right one at once", async () => {
    const u = await newUser("burst@example.test");
    // The right password goes last: argon2 runs in a FIFO thread pool, so it finishes after the lock.
    const guesses = [
      ...Array.from({ length: 39 }, (_, i) => `wrong guess number ${i}`),
      u.password,
    ];
    const results = await Promise.all(
      guesses.map((password) => signIn({ email: u.email, password })),
    );

    const events = await eventsFor(u.id);
    const firstLock = events.find((e) => e.action === "auth.locked_out");
    expect(firstLock).toBeDefined();
    // Every session issued was issued before the first lock, never after it.
    const signedIn = events.filter((e) => e.action === "auth.signed_in");
    for (const e of signedIn) expect(e.seq).toBeLessThan(firstLock!.seq);
    const stored = await t.db.select().from(sessions).where(eq(sessions.userId, u.id));
    expect(stored).toHaveLength(signedIn.length);
    expect(results.filter((r) => r.ok)).toHaveLength(signedIn.length);
    // Given the order, the right password arrives after the lock and is refused; the account stays locked.
    expect(results.at(-1)).toEqual({ ok: false, message: SIGN_IN_FAILED });
    const [row] = await t.db.select().from(users).where(eq(users.id, u.id));
    expect(row.lockedUntil).not.toBeNull();
  });

  it("counts every one of 12 parallel wrong passwords made while unlocked (threshold 5: 5 count, the 6th onwards meet the lock)", async () => {
    const u = await newUser("count@example.test");
    await Promise.all(
      Array.from({ length: 12 }, (_, i) => signIn({ email: u.email, password: `nope ${i}` })),
    );
    const events = await eventsFor(u.id);
    const failures = events
      .filter((e) => e.action === "auth.sign_in_failed")
      .map((e) => JSON.parse(e.newValue!).reason);
    expect(failures.filter((r) => r === "wrong password")).toHaveLength(5);
    expect(failures.filter((r) => r === "account locked")).toHaveLength(7);
    expect(events.filter((e) => e.action === "auth.locked_out")).toHaveLength(1);
  });
});

describe("e-mail to administrators when an account locks", () => {
  it("queues one message per active administrator in the locking transaction, and none before", async () => {
    const adminA = await newUser("admin-a@example.test", ["admin"]);
    const adminB = await newUser("admin-b@example.test", ["admin"]);
    const u = await newUser("locked-mail@example.test");
    const start = new Date("2026-04-01T09:00:00.000Z");
    for (let i = 0; i < 4; i++)
      await signIn({ email: u.email, password: `bad ${i}` }, new Date(start.getTime() + i * 1000));
    const subject = "[Washproof] Account locked: User locked-mail@example.test";
    expect(
      await t.db.select().from(emailOutbox).where(eq(emailOutbox.subject, subject)),
    ).toHaveLength(0);
    await signIn(
      { email: u.email, password: "bad 5", sourceAddress: "203.0.113.9" },
      new Date(start.getTime() + 5000),
    );
    const mails = await t.db.select().from(emailOutbox).where(eq(emailOutbox.subject, subject));
    expect(mails.map((m) => m.to).sort()).toEqual([adminA.email, adminB.email].sort());
    expect(mails[0].text).toContain("locked-mail@example.test");
    expect(mails[0].text).toContain("203.0.113.9");
    // Failures while locked send nothing more.
    await signIn({ email: u.email, password: "bad 6" }, new Date(start.getTime() + 6000));
    expect(
      await t.db.select().from(emailOutbox).where(eq(emailOutbox.subject, subject)),
    ).toHaveLength(2);
  });
});

describe("per-address throttle", () => {
  it("refuses an address after 10 failures (the default) before any account's counter moves", async () => {
    const victim = await newUser("victim@example.test");
    const spray = Array.from({ length: 10 }, (_, i) => `nobody-${i}@example.test`);
    const now = new Date("2026-04-02T10:00:00.000Z");
    for (const email of spray) {
      expect(
        await signIn({ email, password: "guess guess guess", sourceAddress: "198.51.100.7" }, now),
      ).toEqual({ ok: false, message: SIGN_IN_FAILED });
    }
    // The eleventh try from that address is refused, and the victim's account is untouched — even with the right password.
    for (const password of ["wrong one", "wrong two", victim.password]) {
      expect(
        await signIn({ email: victim.email, password, sourceAddress: "198.51.100.7" }, now),
      ).toEqual({ ok: false, message: SIGN_IN_THROTTLED });
    }
    const [row] = await t.db.select().from(users).where(eq(users.id, victim.id));
    expect(row.failedAttempts).toBe(0);
    expect(row.lockedUntil).toBeNull();
    expect(
      (await eventsFor(victim.id)).filter((e) => e.action === "auth.sign_in_failed"),
    ).toHaveLength(0);
    // Another address is not affected, and the block ends after 15 minutes (the default).
    expect(
      (
        await signIn(
          { email: victim.email, password: victim.password, sourceAddress: "198.51.100.8" },
          now,
        )
      ).ok,
    ).toBe(true);
    const later = new Date(now.getTime() + 15 * 60_000 + 1000);
    expect(
      (
        await signIn(
          { email: victim.email, password: victim.password, sourceAddress: "198.51.100.7" },
          later,
        )
      ).ok,
    ).toBe(true);
  });

  it("holds in a parallel burst from one address: at most the limit of failures reach accounts", async () => {
    const u = await newUser("burst-address@example.test");
    const now = new Date("2026-04-03T10:00:00.000Z");
    await Promise.all(
      Array.from({ length: 30 }, (_, i) =>
        signIn({ email: u.email, password: `x${i}`, sourceAddress: "192.0.2.55" }, now),
      ),
    );
    const failures = (await eventsFor(u.id)).filter((e) => e.action === "auth.sign_in_failed");
    expect(failures).toHaveLength(10);
    const [throttle] = await t.db
      .select()
      .from(signInThrottle)
      .where(eq(signInThrottle.address, "192.0.2.55"));
    expect(isBlocked(throttle, now)).toBe(true);
  });

  it("rules, pure: a window that has passed starts again; the address comes from the trusted end of X-Forwarded-For", () => {
    const policy = { limit: 3, windowMs: 60_000, blockMs: 120_000 };
    const t0 = new Date("2026-01-01T00:00:00.000Z");
    let s = afterAddressFailure(undefined, t0, policy);
    s = afterAddressFailure(s, new Date(t0.getTime() + 10_000), policy);
    expect(s).toMatchObject({ failures: 2, blockedUntil: null });
    // 61 s after the window opened: a fresh window, not a block.
    s = afterAddressFailure(s, new Date(t0.getTime() + 61_000), policy);
    expect(s).toMatchObject({ failures: 1, blockedUntil: null });
    s = afterAddressFailure(
      afterAddressFailure(s, new Date(t0.getTime() + 62_000), policy),
      new Date(t0.getTime() + 63_000),
      policy,
    );
    expect(s.blockedUntil).toBe(new Date(t0.getTime() + 63_000 + 120_000).toISOString());

    expect(sourceAddress("10.0.0.1", 0)).toBe("10.0.0.1");
    // A client-written entry on the left is ignored behind one proxy that appends.
    expect(sourceAddress("6.6.6.6, 203.0.113.4", 1)).toBe("203.0.113.4");
    expect(sourceAddress("6.6.6.6, 203.0.113.4, 10.0.0.2", 2)).toBe("203.0.113.4");
    expect(sourceAddress(null, 1)).toBeNull();
  });
});

describe("sessions at rest and in the browser", () => {
  it("stores only the SHA-256 of the cookie's token; the stored id itself does not validate", async () => {
    const u = await newUser("hashed@example.test");
    const result = await signIn({ email: u.email, password: u.password });
    if (!result.ok) throw new Error("sign-in failed");
    const [row] = await t.db
      .select()
      .from(sessions)
      .where(and(eq(sessions.userId, u.id)));
    expect(row.id).not.toBe(result.token);
    expect(row.id).toMatch(/^[0-9a-f]{64}$/);
    const { createHash } = await import("node:crypto");
    expect(row.id).toBe(createHash("sha256").update(result.token).digest("hex"));
    expect(await validateSession(result.token)).toMatchObject({ id: u.id, sessionId: row.id });
    // Someone holding a copy of the database has the id, not the token: it opens nothing.
    expect(await validateSession(row.id)).toBeNull();
  });

  it("sets a browser-session cookie: no Expires, no Max-Age", async () => {
    const u = await newUser("cookie@example.test");
    const { token } = await createSession(u.id);
    const cookie = cookieForSession(token);
    expect(cookie.value).toBe(token);
    expect(cookie.attributes).not.toHaveProperty("maxAge");
    expect(cookie.attributes).not.toHaveProperty("expires");
    expect(cookie.attributes).toMatchObject({ httpOnly: true, sameSite: "lax", path: "/" });
    expect(sessionCookie("x", true).attributes.secure).toBe(true);
  });
});

describe("signing refusals say how many attempts are left", () => {
  it("counts down, says when it locks, and then refuses the right password", async () => {
    const u = await newUser("signer@example.test");
    const now = new Date("2026-04-04T08:00:00.000Z");
    const messages: string[] = [];
    for (let i = 0; i < 5; i++) {
      await verifySigner({ userId: u.id, password: `bad ${i}` }, now).catch((e: Error) =>
        messages.push(e.message),
      );
    }
    expect(messages.slice(0, 4)).toEqual([
      "The password is not correct. Nothing was signed. 4 attempts left before your account locks.",
      "The password is not correct. Nothing was signed. 3 attempts left before your account locks.",
      "The password is not correct. Nothing was signed. 2 attempts left before your account locks.",
      "The password is not correct. Nothing was signed. 1 attempt left before your account locks.",
    ]);
    expect(messages[4]).toMatch(/Your account is now locked for 15 minutes/);
    await expect(verifySigner({ userId: u.id, password: u.password }, now)).rejects.toThrow(
      /account is locked/,
    );
  });

  it("holds in a parallel burst of signings too: the right password after the lock signs nothing", async () => {
    const u = await newUser("signer-burst@example.test");
    const guesses = [...Array.from({ length: 19 }, (_, i) => `wrong ${i}`), u.password];
    const settled = await Promise.allSettled(
      guesses.map((password) => verifySigner({ userId: u.id, password })),
    );
    expect(settled.at(-1)).toMatchObject({
      status: "rejected",
      reason: { message: expect.stringMatching(/account is locked/) },
    });
    const events = await eventsFor(u.id);
    expect(events.filter((e) => e.action === "auth.locked_out")).toHaveLength(1);
    expect(
      events.filter(
        (e) =>
          e.action === "auth.sign_in_failed" && JSON.parse(e.newValue!).reason === "wrong password",
      ),
    ).toHaveLength(5);
  });

  it("keeps the audit chain intact", async () => {
    expect((await verifyAuditChain(t.db)).ok).toBe(true);
  });
});
