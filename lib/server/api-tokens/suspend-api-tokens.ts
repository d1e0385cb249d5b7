import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { apiTokens } from "@/db/schema";

/**
 * Suspends every live token of a user inside the caller's transaction (a password
 * reset or a deactivation): whoever was locked out of the account must not keep
 * working through its tokens. Returns the ids, for the caller's audit event.
 */
export async function suspendApiTokens(
  tx: Tx,
  userId: string,
  reason: string,
  now: Date,
): Promise<string[]> {
  const live = and(
    eq(apiTokens.userId, userId),
    isNull(apiTokens.revokedAt),
    isNull(apiTokens.suspendedAt),
  );
  const rows = await tx
    .update(apiTokens)
    .set({ suspendedAt: now.toISOString(), suspendedReason: reason })
    .where(live)
    .returning({ id: apiTokens.id });
  return rows.map((r) => r.id).sort();
}
