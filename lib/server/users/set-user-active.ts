import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { sessions, userRoles, users } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { suspendApiTokens } from "@/lib/server/api-tokens/suspend-api-tokens";
import { UserFacingError } from "@/lib/server/errors";
import { assertAnotherActiveAdmin } from "./last-admin";

/** Deactivates (users are never deleted: their signatures and audit events stay theirs) or reactivates. */
export async function setUserActive(
  actor: AuditActor,
  input: { userId: string; active: boolean; reason: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const [user] = await tx.select().from(users).where(eq(users.id, input.userId));
    if (!user) throw new UserFacingError("That user does not exist.", { kind: "not_found" });
    // A stale page or a second click: say so rather than report a change that did not happen.
    if (user.active === input.active)
      throw new UserFacingError(
        `This account is already ${input.active ? "active" : "deactivated"}; nothing changed.`,
      );
    // Reactivation does not revive suspended tokens: the user creates new ones.
    let suspendedApiTokens: string[] = [];
    if (!input.active) {
      if (user.id === actor.id)
        throw new UserFacingError("You cannot deactivate your own account.");
      const roles = await tx.select().from(userRoles).where(eq(userRoles.userId, user.id));
      if (roles.some((r) => r.role === "admin")) await assertAnotherActiveAdmin(tx, user.id);
      await tx.delete(sessions).where(eq(sessions.userId, user.id));
      suspendedApiTokens = await suspendApiTokens(tx, user.id, "the owner was deactivated", now);
    }
    await tx
      .update(users)
      .set({ active: input.active, failedAttempts: 0, lockedUntil: null })
      .where(eq(users.id, user.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: input.active ? "user.reactivated" : "user.deactivated",
        recordType: "user",
        recordId: user.id,
        old: { active: user.active },
        new: input.active ? { active: true } : { active: false, suspendedApiTokens },
        reason: input.reason,
      },
      now,
    );
  });
}
