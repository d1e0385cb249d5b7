import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens } from "@/db/schema";

/** The user's tokens as the settings page lists them: never the hash. */
export async function listApiTokens(userId: string) {
  return getDb()
    .select({
      id: apiTokens.id,
      name: apiTokens.name,
      prefix: apiTokens.prefix,
      scope: apiTokens.scope,
      createdAt: apiTokens.createdAt,
      lastUsedAt: apiTokens.lastUsedAt,
      expiresAt: apiTokens.expiresAt,
      revokedAt: apiTokens.revokedAt,
      suspendedAt: apiTokens.suspendedAt,
      suspendedReason: apiTokens.suspendedReason,
    })
    .from(apiTokens)
    .where(eq(apiTokens.userId, userId))
    .orderBy(desc(apiTokens.createdAt));
}
