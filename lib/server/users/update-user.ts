import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { userRoles, users } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { isUniqueViolation, UserFacingError } from "@/lib/server/errors";
import type { NewUser } from "./create-user";
import { assertAnotherActiveAdmin } from "./last-admin";

/** Changes a user's details and roles; the audit event holds exactly what changed, and why the roles did. */
export async function updateUser(
  actor: AuditActor,
  input: NewUser & { userId: string; reason?: string | null },
) {
  const reason = input.reason?.trim() || null;
  try {
    await getDb().transaction(async (tx) => {
      const [before] = await tx.select().from(users).where(eq(users.id, input.userId));
      if (!before) throw new UserFacingError("That user does not exist.", { kind: "not_found" });
      const oldRoles = (await tx.select().from(userRoles).where(eq(userRoles.userId, input.userId)))
        .map((r) => r.role)
        .sort();
      const newRoles = [...new Set(input.roles)].sort();
      if (oldRoles.includes("admin") && !newRoles.includes("admin")) {
        await assertAnotherActiveAdmin(tx, input.userId);
      }
      const old = { name: before.name, email: before.email, jobTitle: before.jobTitle };
      const next = { name: input.name, email: input.email, jobTitle: input.jobTitle };
      const changed = Object.fromEntries(
        Object.entries(next).filter(([k, v]) => old[k as keyof typeof old] !== v),
      );
      if (Object.keys(changed).length > 0) {
        await tx.update(users).set(changed).where(eq(users.id, input.userId));
        const oldPart = Object.fromEntries(
          Object.keys(changed).map((k) => [k, old[k as keyof typeof old]]),
        );
        await appendAudit(tx, actor, {
          eventType: "user.updated",
          recordType: "user",
          recordId: input.userId,
          old: oldPart,
          new: changed,
          reason,
        });
      }
      if (oldRoles.join() !== newRoles.join()) {
        // A role decides what a person may sign: the change needs its reason, checked before anything is written.
        if (!reason)
          throw new UserFacingError("Give the reason for changing this person's roles.", {
            kind: "invalid",
            field: "reason",
          });
        await tx.delete(userRoles).where(eq(userRoles.userId, input.userId));
        await tx.insert(userRoles).values(newRoles.map((role) => ({ userId: input.userId, role })));
        await appendAudit(tx, actor, {
          eventType: "user.roles_changed",
          recordType: "user",
          recordId: input.userId,
          old: { roles: oldRoles },
          new: { roles: newRoles },
          reason,
        });
      }
    });
  } catch (error) {
    if (isUniqueViolation(error))
      throw new UserFacingError("A user with this e-mail address already exists.", "email");
    throw error;
  }
}
