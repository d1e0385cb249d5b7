import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { generateTemporaryPassword, hashPassword } from "@/lib/auth/password";
import { UserFacingError } from "@/lib/server/errors";

/** Issues a temporary password, ends the user's sessions and releases a lockout. */
export async function resetPassword(actor: AuditActor, input: { userId: string }) {
  const temporaryPassword = generateTemporaryPassword();
  const passwordHash = await hashPassword(temporaryPassword);
  await getDb().transaction(async (tx) => {
    const [user] = await tx.select({ id: users.id }).from(users).where(eq(users.id, input.userId));
    if (!user) throw new UserFacingError("That user does not exist.", { kind: "not_found" });
    await tx
      .update(users)
      .set({ passwordHash, mustChangePassword: true, failedAttempts: 0, lockedUntil: null })
      .where(eq(users.id, input.userId));
    await tx.delete(sessions).where(eq(sessions.userId, input.userId));
    // The password itself never enters the audit trail.
    await appendAudit(tx, actor, { eventType: "user.password_reset", recordType: "user", recordId: input.userId, new: { mustChangePassword: true } });
  });
  return { temporaryPassword };
}
