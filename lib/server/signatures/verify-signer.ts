import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";
import { isLocked } from "@/lib/auth/lockout";
import { verifyPassword } from "@/lib/auth/password";
import { countFailedAttempt, lockoutPolicy } from "@/lib/server/auth/sign-in";
import { UserFacingError } from "@/lib/server/errors";

function attemptsLeftText(n: number) {
  return n === 1
    ? "1 attempt left before your account locks."
    : `${n} attempts left before your account locks.`;
}

/**
 * The second signature component (21 CFR 11.200(a)): the signer re-enters their
 * password for every signing. A wrong password counts toward the lockout and is
 * audited, exactly as a failed sign-in, and the refusal says how many attempts
 * remain. The lock state is re-read in the same write transaction that counts the
 * failure, so parallel attempts cannot slip past a lock. Call before the signing
 * transaction.
 */
export async function verifySigner(input: { userId: string; password: string }, now = new Date()) {
  const db = getDb();
  const [user] = await db.select().from(users).where(eq(users.id, input.userId));
  if (!user || !user.active)
    throw new UserFacingError("Your account may not sign.", { kind: "forbidden" });
  const ok = await verifyPassword(user.passwordHash, input.password);
  const refusal = await db.transaction(
    async (tx): Promise<{ message: string; kind: "invalid" | "locked" | "forbidden" } | null> => {
      const [current] = await tx.select().from(users).where(eq(users.id, input.userId));
      if (!current || !current.active)
        return { message: "Your account may not sign.", kind: "forbidden" };
      if (ok && current.passwordHash === user.passwordHash && !isLocked(current, now)) {
        // A right password clears the count, as at sign-in.
        if (current.failedAttempts > 0)
          await tx.update(users).set({ failedAttempts: 0 }).where(eq(users.id, current.id));
        return null;
      }
      const counted = await countFailedAttempt(tx, current, "signing", now);
      switch (counted.state) {
        case "counted":
          return {
            message: `The password is not correct. Nothing was signed. ${attemptsLeftText(counted.attemptsLeft)}`,
            kind: "invalid",
          };
        case "locked_now":
          return {
            message: `The password is not correct. Nothing was signed. Your account is now locked for ${Math.round(lockoutPolicy().windowMs / 60_000)} minutes; the administrators have been told.`,
            kind: "locked",
          };
        case "already_locked":
          return {
            message:
              "Your account is locked after too many wrong passwords. Nothing was signed. Wait until it unlocks or ask an administrator.",
            kind: "locked",
          };
        default:
          return { message: "Your account may not sign.", kind: "forbidden" };
      }
    },
  );
  if (refusal)
    throw new UserFacingError(refusal.message, { kind: refusal.kind, field: "password" });
  return { id: user.id, name: user.name };
}
