import "server-only";
import { and, eq, ne } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { passwordIsEmail } from "@/lib/schemas/account";
import { recordFailedAttempt } from "@/lib/server/auth/sign-in";
import { UserFacingError } from "@/lib/server/errors";

/** The user's own change: proves the current password, keeps this session, ends the others. */
export async function changePassword(input: {
  userId: string;
  sessionId: string;
  currentPassword: string;
  newPassword: string;
}) {
  const db = getDb();
  const [user] = await db.select().from(users).where(eq(users.id, input.userId));
  if (!user) throw new UserFacingError("That user does not exist.", { kind: "not_found" });
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    await recordFailedAttempt(user.id, "signing");
    throw new UserFacingError("The current password is not correct.", { kind: "invalid", field: "currentPassword" });
  }
  if (passwordIsEmail(input.newPassword, user.email)) {
    throw new UserFacingError("The password must not be your e-mail address.", { kind: "invalid", field: "newPassword" });
  }
  const passwordHash = await hashPassword(input.newPassword);
  await db.transaction(async (tx) => {
    await tx
      .update(users)
      .set({ passwordHash, mustChangePassword: false, passwordChangedAt: new Date().toISOString() })
      .where(eq(users.id, user.id));
    await tx.delete(sessions).where(and(eq(sessions.userId, user.id), ne(sessions.id, input.sessionId)));
    await appendAudit(tx, { id: user.id, name: user.name }, { eventType: "auth.password_changed", recordType: "user", recordId: user.id });
  });
}
