import { eq } from "drizzle-orm";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { auditEvents, companySettings, sites, userRoles, users } from "@/db/schema";
import { verifyAuditChain } from "@/lib/audit";
import { verifyPassword } from "@/lib/auth/password";
import { setUpPlantSchema } from "@/lib/schemas/plant-setup";
import { ALREADY_SET_UP, plantNeedsSetUp, setUpPlant } from "@/lib/server/plant/set-up-plant";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
beforeEach(async () => {
  t = await createTestDatabase();
});
afterEach(() => t.cleanup());

const typed = {
  companyName: "Quillan Precision Ltd",
  siteName: "Eastmoor works",
  siteLocation: "Eastmoor",
  adminName: "Asha Penrose",
  adminEmail: " Asha@Quillan.example ",
  password: "long-enough-pass-2026",
  confirmPassword: "long-enough-pass-2026",
};

describe("setting up an empty installation", () => {
  it("creates the first administrator, the company and the site, each audited by that administrator", async () => {
    expect(await plantNeedsSetUp()).toBe(true);
    const { adminId, siteId } = await setUpPlant(setUpPlantSchema.parse(typed));
    const [admin] = await t.db.select().from(users).where(eq(users.id, adminId));
    expect(admin.email).toBe("asha@quillan.example");
    expect(admin.mustChangePassword).toBe(false);
    expect(await verifyPassword(admin.passwordHash, typed.password)).toBe(true);
    expect(
      await t.db
        .select({ role: userRoles.role })
        .from(userRoles)
        .where(eq(userRoles.userId, adminId)),
    ).toEqual([{ role: "admin" }]);
    expect((await t.db.select().from(companySettings))[0].companyName).toBe(
      "Quillan Precision Ltd",
    );
    expect((await t.db.select().from(sites).where(eq(sites.id, siteId)))[0].name).toBe(
      "Eastmoor works",
    );
    const events = await t.db.select().from(auditEvents);
    expect(events.map((e) => e.action)).toEqual(["user.created", "company.set_up", "site.created"]);
    expect(events.every((e) => e.actorId === adminId)).toBe(true);
    expect((await verifyAuditChain(t.db)).ok).toBe(true);
    expect(await plantNeedsSetUp()).toBe(false);
  });

  it("is refused once any user exists, and writes nothing", async () => {
    await setUpPlant(setUpPlantSchema.parse(typed));
    const before = await t.db.select().from(auditEvents);
    await expect(
      setUpPlant(setUpPlantSchema.parse({ ...typed, adminEmail: "other@quillan.example" })),
    ).rejects.toThrow(ALREADY_SET_UP);
    expect(await t.db.select().from(users)).toHaveLength(1);
    expect(await t.db.select().from(sites)).toHaveLength(1);
    expect(await t.db.select().from(auditEvents)).toHaveLength(before.length);
  });

  it("keeps today's password rules: at least 12 characters, typed twice alike, not the e-mail", () => {
    const fields = (input: object) =>
      setUpPlantSchema.safeParse({ ...typed, ...input }).error?.issues.map((i) => i.path.join("."));
    expect(fields({ password: "short-pass1", confirmPassword: "short-pass1" })).toEqual([
      "password",
    ]);
    expect(fields({ confirmPassword: "long-enough-pass-2027" })).toEqual(["confirmPassword"]);
    expect(
      fields({ password: "asha@quillan.example", confirmPassword: "asha@quillan.example" }),
    ).toEqual(["password"]);
    expect(fields({ companyName: " ", siteName: "", adminEmail: "not-an-address" })).toEqual([
      "companyName",
      "siteName",
      "adminEmail",
    ]);
  });
});
