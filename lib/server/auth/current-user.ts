import "server-only";
import { cookies } from "next/headers";
import { forbidden, redirect } from "next/navigation";
import { cache } from "react";
import { can, type Permission } from "@/lib/auth/permissions";
import { SESSION_COOKIE } from "@/lib/auth/session-cookie";
import { validateSession, type SessionUser } from "./sessions";

/** The signed-in user of this request, validated once per request. */
export const getCurrentUser = cache(async (): Promise<SessionUser | null> => {
  const token = (await cookies()).get(SESSION_COOKIE)?.value;
  if (!token) return null;
  return validateSession(token);
});

/** For pages: sign-in when there is no session, a 403 page when the role may not. */
export async function requirePageUser(
  permission?: Permission,
  opts: { allowPasswordChange?: boolean } = {},
): Promise<SessionUser> {
  const user = await getCurrentUser();
  if (!user) redirect("/sign-in");
  if (user.mustChangePassword && !opts.allowPasswordChange) redirect("/account/password");
  if (permission && !can(user.roles, permission)) forbidden();
  return user;
}

export type Authorized =
  { ok: true; user: SessionUser } | { ok: false; message: string; status: 401 | 403 };

/** For server actions and route handlers: never throws, returns a message for the caller. */
export async function authorize(permission: Permission): Promise<Authorized> {
  const user = await getCurrentUser();
  if (!user) return { ok: false, status: 401, message: "Your session has ended. Sign in again." };
  if (user.mustChangePassword && permission !== "account.change_password") {
    return { ok: false, status: 403, message: "Change your temporary password first." };
  }
  if (!can(user.roles, permission))
    return { ok: false, status: 403, message: "Your role does not allow this." };
  return { ok: true, user };
}
