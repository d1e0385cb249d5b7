import { createHash, randomBytes } from "node:crypto";

/**
 * The cookie carries a random token; the database keeps only its SHA-256 as the
 * session id, so a backup or a read of the sessions table yields no usable session.
 * 25 random bytes are far beyond guessing, so a fast hash is enough.
 */
export function generateSessionToken(): string {
  return randomBytes(25).toString("base64url");
}

export function sessionIdFromToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}
