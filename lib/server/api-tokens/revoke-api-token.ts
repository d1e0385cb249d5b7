import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { formatDate } from "@/lib/format/date";

/** Revokes one of the user's own tokens; it fails its next request. */
export async function revokeApiToken(
  actor: { id: string; name: string } & AuditActor,
  input: { tokenId: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const [token] = await tx
      .select()
      .from(apiTokens)
      .where(and(eq(apiTokens.id, input.tokenId), eq(apiTokens.userId, actor.id)));
    if (!token) throw new UserFacingError("That token does not exist.", { kind: "not_found" });
    if (token.revokedAt)
      throw new UserFacingError(
        `That token was already revoked on ${formatDate(token.revokedAt)}.`,
      );
    const revokedAt = now.toISOString();
    await tx.update(apiTokens).set({ revokedAt }).where(eq(apiTokens.id, token.id));
    await appendAudit(tx, actor, {
      eventType: "api_token.revoked",
      recordType: "api_token",
      recordId: token.id,
      old: { revokedAt: null },
      new: { name: token.name, prefix: token.prefix, revokedAt },
    });
  });
}
