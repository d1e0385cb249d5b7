import "server-only";
import { and, eq, ne } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { passwordProblem } from "@/lib/auth/password-rules";
import { PASSWORD_HISTORY } from "@/lib/schemas/account";
import { recordFailedAttempt } from "@/lib/server/auth/sign-in";
import { UserFacingError } from "@/lib/server/errors";
import { rememberPassword, usedRecently } from "./password-history";

/**
 * The user's own change: proves the current password, holds the new one to the
 * rules (not the name or e-mail, not easy to guess, not one of the last five),
 * keeps this session and ends the others.
 */
export async function changePassword(
  input: {
    userId: string;
    sessionId: string;
    currentPassword: string;
    newPassword: string;
  },
  now = new Date(),
) {
  const db = getDb();
  const [user] = await db.select().from(users).where(eq(users.id, input.userId));
  if (!user) throw new UserFacingError("That user does not exist.", { kind: "not_found" });
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    await recordFailedAttempt(user.id, "signing", now);
    throw new UserFacingError("The current password is not correct.", {
      kind: "invalid",
      field: "currentPassword",
    });
  }
  const problem = passwordProblem(input.newPassword, user);
  if (problem) throw new UserFacingError(problem, { kind: "invalid", field: "newPassword" });
  if (await usedRecently(db, user, input.newPassword)) {
    throw new UserFacingError(
      `Choose a password you have not used before: your last ${PASSWORD_HISTORY} are refused.`,
      { kind: "invalid", field: "newPassword" },
    );
  }
  const passwordHash = await hashPassword(input.newPassword);
  await db.transaction(async (tx) => {
    const [current] = await tx
      .select({ passwordHash: users.passwordHash })
      .from(users)
      .where(eq(users.id, user.id));
    // Changed meanwhile (another tab, an administrator's reset): what was checked above no longer holds.
    if (current?.passwordHash !== user.passwordHash)
      throw new UserFacingError("Your password was changed meanwhile. Sign in again and retry.");
    await rememberPassword(tx, user.id, user.passwordHash, now);
    await tx
      .update(users)
      .set({ passwordHash, mustChangePassword: false, passwordChangedAt: now.toISOString() })
      .where(eq(users.id, user.id));
    await tx
      .delete(sessions)
      .where(and(eq(sessions.userId, user.id), ne(sessions.id, input.sessionId)));
    await appendAudit(
      tx,
      { id: user.id, name: user.name },
      { eventType: "auth.password_changed", recordType: "user", recordId: user.id },
      now,
    );
  });
}
