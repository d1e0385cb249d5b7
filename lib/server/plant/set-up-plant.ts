// Not "server-only": `npm run admin:create` and the demo seed call this under tsx.
import { count } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { companySettings, sites, userRoles, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { hashPassword } from "@/lib/auth/password";
import { passwordProblem } from "@/lib/auth/password-rules";
import type { SetUpPlantInput } from "@/lib/schemas/plant-setup";
import { UserFacingError } from "@/lib/server/errors";

export const ALREADY_SET_UP =
  "This installation is already set up: an administrator exists. Sign in, or ask an administrator for an account.";

export type PlantSetUp = { adminId: string; siteId: string };

/**
 * Inside a transaction: the company, its first site and its first administrator, each audited
 * as done by that administrator. Refused once any user exists, so the set-up page and the
 * script can never add a second administrator behind everyone's back.
 */
export async function setUpPlantIn(
  tx: Tx,
  input: Omit<SetUpPlantInput, "password" | "confirmPassword"> & {
    passwordHash: string;
    jobTitle?: string | null;
  },
): Promise<PlantSetUp> {
  const [{ n }] = await tx.select({ n: count() }).from(users);
  if (n > 0) throw new UserFacingError(ALREADY_SET_UP);
  const [admin] = await tx
    .insert(users)
    .values({
      name: input.adminName,
      email: input.adminEmail,
      jobTitle: input.jobTitle ?? null,
      passwordHash: input.passwordHash,
      passwordChangedAt: new Date().toISOString(),
    })
    .returning({ id: users.id });
  await tx.insert(userRoles).values({ userId: admin.id, role: "admin" });
  const actor = { id: admin.id, name: input.adminName };
  await appendAudit(tx, actor, {
    eventType: "user.created",
    recordType: "user",
    recordId: admin.id,
    new: { name: input.adminName, email: input.adminEmail, jobTitle: null, roles: ["admin"] },
    reason: "First administrator of a new installation.",
  });
  await tx.insert(companySettings).values({ companyName: input.companyName });
  await appendAudit(tx, actor, {
    eventType: "company.set_up",
    recordType: "company",
    recordId: "company",
    new: { companyName: input.companyName },
  });
  const [site] = await tx
    .insert(sites)
    .values({ name: input.siteName, location: input.siteLocation })
    .returning({ id: sites.id });
  await appendAudit(tx, actor, {
    eventType: "site.created",
    recordType: "site",
    recordId: site.id,
    new: { name: input.siteName, location: input.siteLocation },
  });
  return { adminId: admin.id, siteId: site.id };
}

/** The first administrator, company and site of an empty installation (set-up page and `npm run admin:create`). */
export async function setUpPlant(input: SetUpPlantInput): Promise<PlantSetUp> {
  const db = getDb();
  // Answer before the slow hash when the installation is plainly set up already.
  const [{ n }] = await db.select({ n: count() }).from(users);
  if (n > 0) throw new UserFacingError(ALREADY_SET_UP);
  // The same strength rule as every other new password (not the name or e-mail, not guessable).
  const weak = passwordProblem(input.password, { name: input.adminName, email: input.adminEmail });
  if (weak) throw new UserFacingError(weak, { kind: "invalid", field: "password" });
  const passwordHash = await hashPassword(input.password);
  return db.transaction((tx) => setUpPlantIn(tx, { ...input, passwordHash }));
}

/** True while the installation has no user at all: the set-up page is open only then. */
export async function plantNeedsSetUp(): Promise<boolean> {
  const [{ n }] = await getDb().select({ n: count() }).from(users);
  return n === 0;
}
