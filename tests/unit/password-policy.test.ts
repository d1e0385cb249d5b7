import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { passwordHistory } from "@/db/schema";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { passwordProblem } from "@/lib/auth/password-rules";
import { passwordChangeSchema } from "@/lib/schemas/account";
import { signIn } from "@/lib/server/auth/sign-in";
import { changePassword } from "@/lib/server/users/change-password";
import { createUser } from "@/lib/server/users/create-user";
import { resetPassword } from "@/lib/server/users/reset-password";
import { createTestDatabase } from "./support/test-db";

const ines = { name: "Ines Varga", email: "ines.varga@fennmoor.example" };

describe("password rules, pure", () => {
  const base = { currentPassword: "old one", confirmPassword: "" };
  const schemaError = (p: string) => {
    const r = passwordChangeSchema.safeParse({ ...base, newPassword: p, confirmPassword: p });
    return r.success ? null : r.error.issues.find((i) => i.path[0] === "newPassword")?.message;
  };

  it("refuses twelve spaces with a plain message, in the schema and in the rules", () => {
    expect(schemaError(" ".repeat(12))).toBe("Use letters, digits or symbols, not only spaces.");
    expect(passwordProblem(" ".repeat(12), ines)).toBe(
      "Use letters, digits or symbols, not only spaces.",
    );
  });

  it("refuses fewer than 12 characters", () => {
    expect(schemaError("Xq7!mR2#pL9")).toBe("Use at least 12 characters.");
    expect(schemaError("Xq7!mR2#pL9z")).toBeNull();
  });

  it("refuses password1234 as a common password, in plain words", () => {
    expect(passwordProblem("password1234", ines)).toBe(
      "This password is too easy to guess: it is close to one of the most used passwords. Use a longer phrase of unrelated words, or add characters that follow no pattern.",
    );
  });

  it("refuses other guessable ones: a keyboard row, a repeated character", () => {
    expect(passwordProblem("qwertyuiop12", ines)).toMatch(/^This password is too easy to guess/);
    expect(passwordProblem("aaaaaaaaaaaa", ines)).toMatch(
      /^This password is too easy to guess: it repeats the same character/,
    );
  });

  it("refuses the person's e-mail and name, whatever the case or punctuation", () => {
    expect(passwordProblem("Ines.Varga@Fennmoor.example", ines)).toBe(
      "The password must not be or contain your e-mail address.",
    );
    expect(passwordProblem("ines.varga-washer-2026", ines)).toBe(
      "The password must not be or contain your e-mail address.",
    );
    expect(passwordProblem("IN-ES VAR-GA 2026 !!", ines)).toBe(
      "The password must not contain your name.",
    );
  });

  it("accepts the demo password and strong passphrases", () => {
    expect(passwordProblem(DEMO_PASSWORD, ines)).toBeNull();
    expect(passwordProblem("basket rinse conductivity", ines)).toBeNull();
    expect(passwordProblem("a brand new passphrase", ines)).toBeNull();
  });
});

describe("password history", () => {
  let t: Awaited<ReturnType<typeof createTestDatabase>>;
  beforeAll(async () => {
    t = await createTestDatabase();
  });
  afterAll(() => t.cleanup());

  it("refuses the current password and the four before it, accepts the sixth-oldest again", async () => {
    const { id, temporaryPassword } = await createUser(
      { id: null, name: "setup" },
      { name: "Olek Brandt", email: "olek@example.test", jobTitle: null, roles: ["engineer"] },
    );
    const first = await signIn({ email: "olek@example.test", password: temporaryPassword });
    if (!first.ok) throw new Error("sign-in failed");
    const phrases = [
      "amber tundra kettle",
      "violet harbor spindle",
      "copper meadow lantern",
      "silent orchard piston",
      "granite willow falcon",
    ];
    let current = temporaryPassword;
    let clock = new Date("2026-06-01T08:00:00.000Z").getTime();
    const change = (newPassword: string) =>
      changePassword(
        { userId: id, sessionId: first.sessionId, currentPassword: current, newPassword },
        new Date((clock += 60_000)),
      );
    for (const p of phrases) {
      await change(p);
      current = p;
    }
    // Current: granite…; the last five are granite, silent, copper, violet, amber.
    for (const p of phrases) {
      await expect(change(p)).rejects.toMatchObject({
        field: "newPassword",
        message: "Choose a password you have not used before: your last 5 are refused.",
      });
    }
    await change("brisk lagoon sextant");
    current = "brisk lagoon sextant";
    // amber… is now the sixth-oldest: allowed again.
    await change("amber tundra kettle");
    current = "amber tundra kettle";
    expect((await signIn({ email: "olek@example.test", password: "amber tundra kettle" })).ok).toBe(
      true,
    );
    // Only what the rule needs is kept.
    expect(
      await t.db.select().from(passwordHistory).where(eq(passwordHistory.userId, id)),
    ).toHaveLength(4);
  });

  it("counts the password an administrator's reset replaced", async () => {
    const { id, temporaryPassword } = await createUser(
      { id: null, name: "setup" },
      { name: "Pia Lund", email: "pia@example.test", jobTitle: null, roles: ["engineer"] },
    );
    const s = await signIn({ email: "pia@example.test", password: temporaryPassword });
    if (!s.ok) throw new Error("sign-in failed");
    await changePassword({
      userId: id,
      sessionId: s.sessionId,
      currentPassword: temporaryPassword,
      newPassword: "tangerine bellows quarry",
    });
    const { temporaryPassword: temp2 } = await resetPassword(
      { id: null, name: "admin" },
      { userId: id },
    );
    const s2 = await signIn({ email: "pia@example.test", password: temp2 });
    if (!s2.ok) throw new Error("sign-in failed");
    await expect(
      changePassword({
        userId: id,
        sessionId: s2.sessionId,
        currentPassword: temp2,
        newPassword: "tangerine bellows quarry",
      }),
    ).rejects.toMatchObject({ field: "newPassword" });
  });

  it("refuses password1234 and twelve spaces at the service too, and changes nothing", async () => {
    const { id, temporaryPassword } = await createUser(
      { id: null, name: "setup" },
      { name: "Rui Costa", email: "rui@example.test", jobTitle: null, roles: ["engineer"] },
    );
    const s = await signIn({ email: "rui@example.test", password: temporaryPassword });
    if (!s.ok) throw new Error("sign-in failed");
    for (const p of ["password1234", " ".repeat(12)]) {
      await expect(
        changePassword({
          userId: id,
          sessionId: s.sessionId,
          currentPassword: temporaryPassword,
          newPassword: p,
        }),
      ).rejects.toMatchObject({ field: "newPassword" });
    }
    expect((await signIn({ email: "rui@example.test", password: temporaryPassword })).ok).toBe(
      true,
    );
  });
});
