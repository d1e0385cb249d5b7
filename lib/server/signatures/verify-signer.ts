import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { isLocked } from "@/lib/auth/lockout";
import { verifyPassword } from "@/lib/auth/password";
import { recordFailedAttempt } from "@/lib/server/auth/sign-in";
import { UserFacingError } from "@/lib/server/errors";

/**
 * The second signature component (21 CFR 11.200(a)): the signer re-enters their
 * password for every signing. A wrong password counts toward the lockout and is
 * audited, exactly as a failed sign-in. Call before the signing transaction.
 */
export async function verifySigner(input: { userId: string; password: string }, now = new Date()) {
  const [user] = await getDb().select().from(users).where(eq(users.id, input.userId));
  if (!user || !user.active) throw new UserFacingError("Your account may not sign.", { kind: "forbidden" });
  const ok = await verifyPassword(user.passwordHash, input.password);
  if (!ok || isLocked(user, now)) {
    await recordFailedAttempt(user.id, "signing", now);
    const locked = isLocked(user, now);
    throw new UserFacingError(locked ? "Your account is locked. Ask an administrator." : "The password is not correct. Nothing was signed.", {
      kind: locked ? "locked" : "invalid",
      field: "password",
    });
  }
  return { id: user.id, name: user.name };
}
