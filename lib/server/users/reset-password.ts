import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { generateTemporaryPassword, hashPassword } from "@/lib/auth/password";
import { suspendApiTokens } from "@/lib/server/api-tokens/suspend-api-tokens";
import { UserFacingError } from "@/lib/server/errors";
import { rememberPassword } from "./password-history";

/** Issues a temporary password, ends the user's sessions, suspends their API tokens and releases a lockout. */
export async function resetPassword(
  actor: AuditActor,
  input: { userId: string },
  now = new Date(),
) {
  const temporaryPassword = generateTemporaryPassword();
  const passwordHash = await hashPassword(temporaryPassword);
  await getDb().transaction(async (tx) => {
    const [user] = await tx
      .select({ id: users.id, passwordHash: users.passwordHash })
      .from(users)
      .where(eq(users.id, input.userId));
    if (!user) throw new UserFacingError("That user does not exist.", { kind: "not_found" });
    // The password being replaced joins the history, so the user cannot choose it again next.
    await rememberPassword(tx, user.id, user.passwordHash, now);
    await tx
      .update(users)
      .set({ passwordHash, mustChangePassword: true, failedAttempts: 0, lockedUntil: null })
      .where(eq(users.id, input.userId));
    await tx.delete(sessions).where(eq(sessions.userId, input.userId));
    const suspendedApiTokens = await suspendApiTokens(
      tx,
      input.userId,
      "the owner's password was reset",
      now,
    );
    // The password itself never enters the audit trail.
    await appendAudit(
      tx,
      actor,
      {
        eventType: "user.password_reset",
        recordType: "user",
        recordId: input.userId,
        new: { mustChangePassword: true, suspendedApiTokens },
      },
      now,
    );
  });
  return { temporaryPassword };
}
