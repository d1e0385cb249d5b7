import { eq } from "drizzle-orm";
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import { auditEvents, users } from "@/db/schema";
import type { Role } from "@/db/enums";
import { verifyAuditChain } from "@/lib/audit";
import { signIn, SIGN_IN_FAILED } from "@/lib/server/auth/sign-in";
import { createSession, validateSession } from "@/lib/server/auth/sessions";
import { createUser } from "@/lib/server/users/create-user";
import { changePassword } from "@/lib/server/users/change-password";
import { resetPassword } from "@/lib/server/users/reset-password";
import { setUserActive } from "@/lib/server/users/set-user-active";
import { updateUser } from "@/lib/server/users/update-user";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const admin = { id: null, name: "test setup" } as const;

beforeAll(async () => {
  t = await createTestDatabase();
});
afterAll(() => t.cleanup());
afterEach(() => vi.useRealTimers());

async function newUser(email: string, roles: ("engineer" | "admin" | "auditor")[] = ["engineer"]) {
  const { id, temporaryPassword } = await createUser(admin, {
    name: `User ${email}`,
    email,
    jobTitle: null,
    roles,
  });
  return { id, password: temporaryPassword };
}

async function actionsFor(userId: string) {
  const rows = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, userId));
  return rows.map((r) => r.action);
}

describe("sign-in", () => {
  it("signs in with the right password and audits it", async () => {
    const u = await newUser("right@example.test");
    const result = await signIn({ email: "RIGHT@example.test ", password: u.password });
    expect(result).toMatchObject({ ok: true, userId: u.id, mustChangePassword: true });
    expect(await actionsFor(u.id)).toContain("auth.signed_in");
  });

  it("gives one message for an unknown e-mail and a wrong password", async () => {
    const u = await newUser("wrong@example.test");
    const unknown = await signIn({ email: "nobody@example.test", password: "whatever password" });
    const wrong = await signIn({ email: "wrong@example.test", password: "not the password" });
    expect(unknown).toEqual({ ok: false, message: SIGN_IN_FAILED });
    expect(wrong).toEqual({ ok: false, message: SIGN_IN_FAILED });
    expect(await actionsFor(u.id)).toContain("auth.sign_in_failed");
  });

  it("locks after 5 failures for 15 minutes, refuses the right password meanwhile, then releases", async () => {
    const u = await newUser("lock@example.test");
    const start = new Date("2026-03-01T10:00:00.000Z");
    for (let i = 0; i < 5; i++) {
      await signIn(
        { email: "lock@example.test", password: `bad guess ${i}` },
        new Date(start.getTime() + i * 1000),
      );
    }
    const [row] = await t.db.select().from(users).where(eq(users.id, u.id));
    expect(row.lockedUntil).toBe(new Date(start.getTime() + 4000 + 15 * 60_000).toISOString());
    expect(await actionsFor(u.id)).toContain("auth.locked_out");

    const during = await signIn(
      { email: "lock@example.test", password: u.password },
      new Date(start.getTime() + 10 * 60_000),
    );
    expect(during.ok).toBe(false);
    const after = await signIn(
      { email: "lock@example.test", password: u.password },
      new Date(start.getTime() + 16 * 60_000),
    );
    expect(after.ok).toBe(true);
  });

  it("refuses a deactivated user", async () => {
    const u = await newUser("gone@example.test");
    await setUserActive(admin, { userId: u.id, active: false, reason: "left the company" });
    expect((await signIn({ email: "gone@example.test", password: u.password })).ok).toBe(false);
  });

  it("refuses to deactivate an account twice, and audits nothing for it", async () => {
    const u = await newUser("twice@example.test");
    await setUserActive(admin, { userId: u.id, active: false, reason: "left the company" });
    await expect(
      setUserActive(admin, { userId: u.id, active: false, reason: "stale page" }),
    ).rejects.toThrow(/already deactivated; nothing changed/);
    expect((await actionsFor(u.id)).filter((a) => a === "user.deactivated")).toHaveLength(1);
  });
});

describe("sessions", () => {
  it("ends after the idle timeout (30 min) and extends on activity", async () => {
    const u = await newUser("idle@example.test");
    vi.useFakeTimers({ toFake: ["Date"] });
    vi.setSystemTime(new Date("2026-03-02T08:00:00.000Z"));
    const session = await createSession(u.id);
    vi.setSystemTime(new Date("2026-03-02T08:20:00.000Z"));
    expect(await validateSession(session.token)).not.toBeNull(); // activity moves expiry to 08:50
    vi.setSystemTime(new Date("2026-03-02T08:45:00.000Z"));
    expect(await validateSession(session.token)).not.toBeNull();
    vi.setSystemTime(new Date("2026-03-02T09:16:00.000Z"));
    expect(await validateSession(session.token)).toBeNull();
  });

  it("ends at the absolute lifetime (12 h) however active", async () => {
    const u = await newUser("absolute@example.test");
    vi.useFakeTimers({ toFake: ["Date"] });
    const start = new Date("2026-03-03T06:00:00.000Z").getTime();
    vi.setSystemTime(start);
    const session = await createSession(u.id);
    for (let m = 20; m < 12 * 60; m += 20) {
      vi.setSystemTime(start + m * 60_000);
      expect(await validateSession(session.token)).not.toBeNull();
    }
    vi.setSystemTime(start + 12 * 60 * 60_000);
    expect(await validateSession(session.token)).toBeNull();
  });

  it("carries the user's roles", async () => {
    const u = await newUser("roles@example.test", ["engineer", "auditor"]);
    const session = await createSession(u.id);
    expect((await validateSession(session.token))?.roles.sort()).toEqual(["auditor", "engineer"]);
  });
});

describe("user administration", () => {
  it("refuses a duplicate e-mail with a field error", async () => {
    await newUser("dup@example.test");
    await expect(newUser("dup@example.test")).rejects.toMatchObject({ field: "email" });
  });

  it("audits a role change with old and new roles and its reason, and refuses a role change without one", async () => {
    const u = await newUser("rolechange@example.test");
    const edit = {
      userId: u.id,
      name: "User rolechange@example.test",
      email: "rolechange@example.test",
      jobTitle: null,
      roles: ["engineer", "auditor"] as Role[],
    };
    await expect(updateUser(admin, edit)).rejects.toMatchObject({ field: "reason" });
    await expect(updateUser(admin, { ...edit, reason: "   " })).rejects.toMatchObject({
      field: "reason",
    });
    expect(
      await t.db.select().from(auditEvents).where(eq(auditEvents.action, "user.roles_changed")),
    ).toEqual([]);
    await updateUser(admin, { ...edit, reason: "Joins the audit team" });
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.action, "user.roles_changed"));
    expect(JSON.parse(event.oldValue!)).toEqual({ roles: ["engineer"] });
    expect(JSON.parse(event.newValue!)).toEqual({ roles: ["auditor", "engineer"] });
    expect(event.reason).toBe("Joins the audit team");
    // Details alone need no reason.
    await updateUser(admin, { ...edit, jobTitle: "Auditor" });
  });

  it("never leaves the plant without an active administrator", async () => {
    const only = await newUser("onlyadmin@example.test", ["admin"]);
    // Other admins may exist from earlier tests in this file: deactivate them first.
    const admins = await t.db.select().from(users);
    for (const a of admins.filter((x) => x.id !== only.id && x.active)) {
      await setUserActive(admin, { userId: a.id, active: false, reason: "test" });
    }
    await expect(
      updateUser(admin, {
        userId: only.id,
        name: "Only Admin",
        email: "onlyadmin@example.test",
        jobTitle: null,
        roles: ["engineer"],
      }),
    ).rejects.toThrow(/at least one active administrator/);
  });

  it("forces a password change after a reset, and the new password works", async () => {
    const u = await newUser("reset@example.test");
    const { temporaryPassword } = await resetPassword(admin, { userId: u.id });
    const first = await signIn({ email: "reset@example.test", password: temporaryPassword });
    expect(first).toMatchObject({ ok: true, mustChangePassword: true });
    if (!first.ok) return;
    await changePassword({
      userId: u.id,
      sessionId: first.sessionId,
      currentPassword: temporaryPassword,
      newPassword: "a brand new passphrase",
    });
    expect(
      await signIn({ email: "reset@example.test", password: "a brand new passphrase" }),
    ).toMatchObject({ ok: true, mustChangePassword: false });
    await expect(
      changePassword({
        userId: u.id,
        sessionId: first.sessionId,
        currentPassword: "a brand new passphrase",
        newPassword: "reset@example.test",
      }),
    ).rejects.toMatchObject({ field: "newPassword" });
  });

  it("keeps the audit chain intact through all of the above", async () => {
    expect((await verifyAuditChain(t.db)).ok).toBe(true);
  });
});
