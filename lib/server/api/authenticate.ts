import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens, userRoles, users, type Role } from "@/db/schema";
import { bearerToken, hashApiToken } from "@/lib/auth/api-token";
import { can, type Permission } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { unlessUnavailable } from "@/lib/server/errors";

export interface ApiUser {
  id: string;
  name: string;
  email: string;
  roles: Role[];
  tokenId: string;
  /**
   * Who audit events caused through the API name: the owner, with the token's id in
   * the actor's name, so the trail shows which token (instrument, script) made a change.
   */
  actor: { id: string; name: string };
}

export type ApiAuth =
  { ok: true; user: ApiUser } | { ok: false; status: 401 | 403; message: string };

/**
 * Who is calling, from the bearer token, and whether they may: the token's scope
 * limits what it may do (a read token never writes), and the owner's roles decide
 * the rest through the same table as the screens.
 */
export async function authenticateApi(
  request: Request,
  permission: Permission,
  mode: "read" | "write",
  now = new Date(),
): Promise<ApiAuth> {
  const token = bearerToken(request.headers.get("authorization"));
  if (!token)
    return {
      ok: false,
      status: 401,
      message:
        'Send your API token in the Authorization header as "Bearer wpk_…". Create one under Account → API tokens.',
    };
  const db = getDb();
  const [row] = await db
    .select({ token: apiTokens, user: users })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(eq(apiTokens.tokenHash, hashApiToken(token)));
  if (!row)
    return {
      ok: false,
      status: 401,
      message: "This API token is not known. Check it was copied whole, or create a new one.",
    };
  if (row.token.revokedAt)
    return {
      ok: false,
      status: 401,
      message: `This API token was revoked on ${formatDate(row.token.revokedAt)}. Create a new one.`,
    };
  if (row.token.suspendedAt) {
    return {
      ok: false,
      status: 401,
      message: `This API token was suspended on ${formatDate(row.token.suspendedAt)} because ${row.token.suspendedReason ?? "its owner's access changed"}. Create a new one.`,
    };
  }
  // A token with no expiry predates expiry and was not migrated: refuse it rather than let it live for ever.
  if (!row.token.expiresAt || row.token.expiresAt <= now.toISOString()) {
    return {
      ok: false,
      status: 401,
      message: `This API token expired${row.token.expiresAt ? ` on ${formatDate(row.token.expiresAt)}` : ""}. Create a new one.`,
    };
  }
  if (!row.user.active)
    return {
      ok: false,
      status: 401,
      message: "The account that owns this API token is deactivated.",
    };
  if (row.user.lockedUntil && row.user.lockedUntil > now.toISOString())
    return {
      ok: false,
      status: 401,
      message:
        "The account that owns this API token is locked after failed passwords. Try again later.",
    };
  // Recorded before the permission check: a refused call is still a use of the token.
  await unlessUnavailable(() =>
    db
      .update(apiTokens)
      .set({ lastUsedAt: now.toISOString() })
      .where(eq(apiTokens.id, row.token.id)),
  );
  if (mode === "write" && row.token.scope !== "read_write") {
    return {
      ok: false,
      status: 403,
      message: "This API token is read-only. Create a read-and-write token to send data.",
    };
  }
  const roles = (
    await db
      .select({ role: userRoles.role })
      .from(userRoles)
      .where(eq(userRoles.userId, row.user.id))
  ).map((r) => r.role);
  if (!can(roles, permission))
    return { ok: false, status: 403, message: "Your role does not allow this." };
  const actor = { id: row.user.id, name: `${row.user.name} (API token ${row.token.id})` };
  return {
    ok: true,
    user: {
      id: row.user.id,
      name: row.user.name,
      email: row.user.email,
      roles,
      tokenId: row.token.id,
      actor,
    },
  };
}
