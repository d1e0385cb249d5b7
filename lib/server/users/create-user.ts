import "server-only";
import { getDb } from "@/db/client";
import { userRoles, users, type Role } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { generateTemporaryPassword, hashPassword } from "@/lib/auth/password";
import { isUniqueViolation, UserFacingError } from "@/lib/server/errors";

export interface NewUser {
  name: string;
  email: string;
  jobTitle: string | null;
  roles: Role[];
}

/** Creates a user with a one-time temporary password that must be changed at first sign-in. */
export async function createUser(actor: AuditActor, input: NewUser) {
  const temporaryPassword = generateTemporaryPassword();
  const passwordHash = await hashPassword(temporaryPassword);
  try {
    const id = await getDb().transaction(async (tx) => {
      const [row] = await tx
        .insert(users)
        .values({
          name: input.name,
          email: input.email,
          jobTitle: input.jobTitle,
          passwordHash,
          mustChangePassword: true,
        })
        .returning({ id: users.id });
      await tx.insert(userRoles).values(input.roles.map((role) => ({ userId: row.id, role })));
      await appendAudit(tx, actor, {
        eventType: "user.created",
        recordType: "user",
        recordId: row.id,
        new: {
          name: input.name,
          email: input.email,
          jobTitle: input.jobTitle,
          roles: [...input.roles].sort(),
        },
      });
      return row.id;
    });
    return { id, temporaryPassword };
  } catch (error) {
    if (isUniqueViolation(error))
      throw new UserFacingError("A user with this e-mail address already exists.", "email");
    throw error;
  }
}
