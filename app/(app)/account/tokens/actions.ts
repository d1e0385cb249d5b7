"use server";

import { defineAction } from "@/lib/actions/define-action";
import type { FormState } from "@/lib/actions/result";
import { createApiTokenSchema, revokeApiTokenSchema } from "@/lib/schemas/api-token";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { revokeApiToken } from "@/lib/server/api-tokens/revoke-api-token";

export type NewTokenState = (FormState & { token?: string }) | null;

const actorOf = (user: { id: string; name: string }) => ({ id: user.id, name: user.name });

export const createApiTokenAction = defineAction({
  permission: "account.manage_tokens",
  input: createApiTokenSchema,
  run: async ({ user, input }) => {
    const { token } = await createApiToken(actorOf(user), input);
    return { message: `Token "${input.name}" created.`, token };
  },
  revalidate: ["/account/tokens"],
});

export const revokeApiTokenAction = defineAction({
  permission: "account.manage_tokens",
  input: revokeApiTokenSchema,
  run: async ({ user, input }) => {
    await revokeApiToken(actorOf(user), input);
    return { message: "Token revoked." };
  },
  revalidate: ["/account/tokens"],
});
