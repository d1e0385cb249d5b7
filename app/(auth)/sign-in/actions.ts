"use server";

import { cookies } from "next/headers";
import { definePublicAction } from "@/lib/actions/define-action";
import { lucia } from "@/lib/auth/lucia";
import { signInSchema } from "@/lib/schemas/account";
import { signIn } from "@/lib/server/auth/sign-in";

export const signInAction = definePublicAction({
  input: signInSchema,
  run: async ({ input }) => {
    const result = await signIn(input);
    if (!result.ok) return { ok: false as const, message: result.message };
    // A fresh session id at every sign-in (no fixation).
    const cookie = lucia().createSessionCookie(result.sessionId);
    (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
    return { redirect: result.mustChangePassword ? "/account/password" : "/" };
  },
});
