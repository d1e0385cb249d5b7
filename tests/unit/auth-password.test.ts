import { describe, expect, it } from "vitest";
import { generateTemporaryPassword, hashPassword, verifyPassword } from "@/lib/auth/password";
import { passwordChangeSchema, passwordIsEmail } from "@/lib/schemas/account";

describe("password hashing", () => {
  it("hashes with argon2id and verifies only the right password", async () => {
    const hash = await hashPassword("correct horse battery");
    expect(hash.startsWith("$argon2id$")).toBe(true);
    expect(await verifyPassword(hash, "correct horse battery")).toBe(true);
    expect(await verifyPassword(hash, "correct horse batterY")).toBe(false);
  });

  it("salts every hash", async () => {
    const [a, b] = await Promise.all([
      hashPassword("same password 1"),
      hashPassword("same password 1"),
    ]);
    expect(a).not.toBe(b);
  });

  it("treats a malformed stored hash as a failed verification", async () => {
    expect(await verifyPassword("not-a-hash", "anything at all")).toBe(false);
  });

  it("issues temporary passwords of 19 characters that differ each time", () => {
    const a = generateTemporaryPassword();
    expect(a).toMatch(/^[A-Za-z0-9]{4}-[A-Za-z0-9]{4}-[A-Za-z0-9]{4}-[A-Za-z0-9]{4}$/);
    expect(generateTemporaryPassword()).not.toBe(a);
  });
});

describe("password rules", () => {
  const base = { currentPassword: "old password 1", confirmPassword: "" };
  it("requires at least 12 characters", () => {
    const r = passwordChangeSchema.safeParse({
      ...base,
      newPassword: "short pass1",
      confirmPassword: "short pass1",
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["newPassword"]);
  });
  it("requires the confirmation to match", () => {
    const r = passwordChangeSchema.safeParse({
      ...base,
      newPassword: "long enough password",
      confirmPassword: "long enough passw0rd",
    });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(["confirmPassword"]);
  });
  it("accepts a good change", () => {
    const r = passwordChangeSchema.safeParse({
      ...base,
      newPassword: "long enough password",
      confirmPassword: "long enough password",
    });
    expect(r.success).toBe(true);
  });
  it("refuses the e-mail address as password, whatever its case", () => {
    expect(passwordIsEmail("Ines.Varga@Example.com", "ines.varga@example.com")).toBe(true);
    expect(passwordIsEmail("ines.varga@example.com!", "ines.varga@example.com")).toBe(false);
  });
});
