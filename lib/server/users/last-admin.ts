import "server-only";
import { and, eq, ne } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { userRoles, users } from "@/db/schema";
import { UserFacingError } from "@/lib/server/errors";

/** The plant must never be left without an active administrator. */
export async function assertAnotherActiveAdmin(tx: Tx, exceptUserId: string) {
  const others = await tx
    .select({ id: users.id })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(eq(userRoles.role, "admin"), eq(users.active, true), ne(users.id, exceptUserId)))
    .limit(1);
  if (others.length === 0)
    throw new UserFacingError("Washproof needs at least one active administrator.");
}
