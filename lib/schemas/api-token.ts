import { z } from "zod";
import "./messages";
import { storedText } from "@/lib/schemas/text";
import { API_TOKEN_SCOPES } from "@/db/enums";

/** Lifetimes offered at creation; a token that never expires keeps working long after anyone remembers it. */
export const TOKEN_LIFETIMES_DAYS = [30, 90, 180, 365] as const;
export const DEFAULT_TOKEN_DAYS = 90;

export const createApiTokenSchema = z.object({
  name: storedText({ error: "Name the token." })
    .trim()
    .min(1, "Name the token, e.g. the instrument or script that uses it.")
    .max(80, "Use at most 80 characters."),
  scope: z.enum(API_TOKEN_SCOPES, { error: "Choose read or read and write." }),
  expiresInDays: z.coerce
    .number({ error: "Choose how long the token works." })
    .refine(
      (d) => (TOKEN_LIFETIMES_DAYS as readonly number[]).includes(d),
      "Choose how long the token works.",
    )
    .default(DEFAULT_TOKEN_DAYS),
});
export type CreateApiToken = z.input<typeof createApiTokenSchema>;

export const revokeApiTokenSchema = z.object({ tokenId: z.uuid("That token does not exist.") });

export const SCOPE_LABELS = { read: "Read", read_write: "Read and write" } as const;
