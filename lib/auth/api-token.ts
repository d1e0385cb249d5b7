import { randomBytes } from "node:crypto";
import { sha256Hex } from "@/lib/audit/hash";

/** Tokens start with this so a leaked one is recognisable in logs and secret scanners. */
export const TOKEN_PREFIX = "wpk_";
const PREFIX_SHOWN = TOKEN_PREFIX.length + 8;

/** 32 random bytes: far beyond guessing, so a fast hash (SHA-256) is enough to store it safely. */
export function generateApiToken(): { token: string; prefix: string; hash: string } {
  const token = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  return { token, prefix: token.slice(0, PREFIX_SHOWN), hash: hashApiToken(token) };
}

export function hashApiToken(token: string): string {
  return sha256Hex(token);
}

/** The token from an `Authorization: Bearer …` header, or null when there is none or it is malformed. */
export function bearerToken(header: string | null): string | null {
  const m = /^Bearer\s+(\S+)\s*$/i.exec(header ?? "");
  if (!m || !m[1].startsWith(TOKEN_PREFIX) || m[1].length > 200) return null;
  return m[1];
}
