"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import type { FormState } from "@/lib/actions/result";
import { invalid } from "@/lib/actions/result";
import { lucia } from "@/lib/auth/lucia";
import { signInSchema } from "@/lib/schemas/account";
import { signIn } from "@/lib/server/auth/sign-in";

export async function signInAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const parsed = signInSchema.safeParse({ email: formData.get("email"), password: formData.get("password") });
  if (!parsed.success) return invalid(parsed.error);
  const result = await signIn(parsed.data);
  if (!result.ok) return { ok: false, message: result.message };
  // A fresh session id at every sign-in (no fixation).
  const cookie = lucia().createSessionCookie(result.sessionId);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
  redirect(result.mustChangePassword ? "/account/password" : "/");
}
