import "server-only";
import { and, eq, gt, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { generateApiToken } from "@/lib/auth/api-token";
import { DEFAULT_TOKEN_DAYS, type CreateApiToken } from "@/lib/schemas/api-token";
import { UserFacingError } from "@/lib/server/errors";

const MAX_ACTIVE = 20;

/** Makes a token for the user, valid for the chosen number of days; the token itself is returned once and never stored. */
export async function createApiToken(
  actor: { id: string; name: string } & AuditActor,
  input: CreateApiToken,
  now = new Date(),
) {
  const { token, prefix, hash } = generateApiToken();
  const days = Number(input.expiresInDays ?? DEFAULT_TOKEN_DAYS);
  const expiresAt = new Date(now.getTime() + days * 86_400_000).toISOString();
  const row = await getDb().transaction(async (tx) => {
    const active = await tx
      .select({ id: apiTokens.id })
      .from(apiTokens)
      .where(
        and(
          eq(apiTokens.userId, actor.id),
          isNull(apiTokens.revokedAt),
          isNull(apiTokens.suspendedAt),
          gt(apiTokens.expiresAt, now.toISOString()),
        ),
      );
    if (active.length >= MAX_ACTIVE)
      throw new UserFacingError(
        `You have ${MAX_ACTIVE} active tokens. Revoke one you no longer use first.`,
      );
    const [created] = await tx
      .insert(apiTokens)
      .values({
        userId: actor.id,
        name: input.name,
        prefix,
        tokenHash: hash,
        scope: input.scope,
        createdAt: now.toISOString(),
        expiresAt,
      })
      .returning();
    await appendAudit(
      tx,
      actor,
      {
        eventType: "api_token.created",
        recordType: "api_token",
        recordId: created.id,
        new: { name: input.name, scope: input.scope, prefix, expiresAt },
      },
      now,
    );
    return created;
  });
  return { token, id: row.id, prefix, expiresAt };
}
