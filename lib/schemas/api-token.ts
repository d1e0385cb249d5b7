import { z } from "zod";
import { storedText } from "@/lib/schemas/text";
import { API_TOKEN_SCOPES } from "@/db/enums";

export const createApiTokenSchema = z.object({
  name: storedText({ error: "Name the token." }).trim().min(1, "Name the token, e.g. the instrument or script that uses it.").max(80, "Use at most 80 characters."),
  scope: z.enum(API_TOKEN_SCOPES, { error: "Choose read or read and write." }),
});
export type CreateApiToken = z.infer<typeof createApiTokenSchema>;

export const revokeApiTokenSchema = z.object({ tokenId: z.uuid("That token does not exist.") });

export const SCOPE_LABELS = { read: "Read", read_write: "Read and write" } as const;
