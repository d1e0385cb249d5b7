"use server";

import { revalidatePath } from "next/cache";
import { invalid, type FormState } from "@/lib/actions/result";
import { createApiTokenSchema, revokeApiTokenSchema } from "@/lib/schemas/api-token";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { revokeApiToken } from "@/lib/server/api-tokens/revoke-api-token";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";

export type NewTokenState = (FormState & { token?: string }) | null;

export async function createApiTokenAction(_prev: NewTokenState, formData: FormData): Promise<NewTokenState> {
  const auth = await authorize("account.manage_tokens");
  if (!auth.ok) return auth;
  const parsed = createApiTokenSchema.safeParse({ name: formData.get("name"), scope: formData.get("scope") ?? undefined, expiresInDays: formData.get("expiresInDays") ?? undefined });
  if (!parsed.success) return invalid(parsed.error);
  try {
    const { token } = await createApiToken({ id: auth.user.id, name: auth.user.name }, parsed.data);
    revalidatePath("/account/tokens");
    return { ok: true, message: `Token "${parsed.data.name}" created.`, token };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function revokeApiTokenAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("account.manage_tokens");
  if (!auth.ok) return auth;
  const parsed = revokeApiTokenSchema.safeParse({ tokenId: formData.get("tokenId") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await revokeApiToken({ id: auth.user.id, name: auth.user.name }, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  revalidatePath("/account/tokens");
  return { ok: true, message: "Token revoked." };
}
