"use server";

import { cookies, headers } from "next/headers";
import { definePublicAction } from "@/lib/actions/define-action";
import { sourceAddress } from "@/lib/auth/throttle";
import { env } from "@/lib/env";
import { signInSchema } from "@/lib/schemas/account";
import { cookieForSession } from "@/lib/server/auth/sessions";
import { signIn } from "@/lib/server/auth/sign-in";

export const signInAction = definePublicAction({
  input: signInSchema,
  run: async ({ input }) => {
    const address = sourceAddress(
      (await headers()).get("x-forwarded-for"),
      env().TRUSTED_PROXY_HOPS,
    );
    const result = await signIn({ ...input, sourceAddress: address });
    if (!result.ok) return { ok: false as const, message: result.message };
    // A fresh session id at every sign-in (no fixation).
    const cookie = cookieForSession(result.token);
    (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
    return { redirect: result.mustChangePassword ? "/account/password" : "/" };
  },
});
