"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import type { FormState } from "@/lib/actions/result";
import { invalid } from "@/lib/actions/result";
import { sourceAddress } from "@/lib/auth/throttle";
import { env } from "@/lib/env";
import { cookieForSession } from "@/lib/server/auth/sessions";
import { signInSchema } from "@/lib/schemas/account";
import { signIn } from "@/lib/server/auth/sign-in";

export async function signInAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const parsed = signInSchema.safeParse({ email: formData.get("email"), password: formData.get("password") });
  if (!parsed.success) return invalid(parsed.error);
  const address = sourceAddress((await headers()).get("x-forwarded-for"), env().TRUSTED_PROXY_HOPS);
  const result = await signIn({ ...parsed.data, sourceAddress: address });
  if (!result.ok) return { ok: false, message: result.message };
  // A fresh session id at every sign-in (no fixation).
  const cookie = cookieForSession(result.token);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
  redirect(result.mustChangePassword ? "/account/password" : "/");
}
