import { hash, verify } from "@node-rs/argon2";
import pLimit from "p-limit";

// argon2id (the library's default algorithm) with OWASP's minimum for argon2id: 19 MiB, 2 passes.
const ARGON2 = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

// One hash at a time: each holds 19 MiB while it runs, and fifty signatures at once took the server
// from 351 to 445 MB (peak RSS in the plant benchmark). A hash takes tens of milliseconds, so a burst
// of sign-ins waits briefly in line instead.
const oneAtATime = pLimit(1);

export function hashPassword(password: string): Promise<string> {
  return oneAtATime(() => hash(password, ARGON2));
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await oneAtATime(() => verify(passwordHash, password));
  } catch {
    return false;
  }
}

/** Verified against when the e-mail is unknown, so both paths take the same time. */
let dummyHash: Promise<string> | undefined;
export function dummyPasswordHash(): Promise<string> {
  dummyHash ??= hashPassword("not-a-real-password-only-for-timing");
  return dummyHash;
}

/** A temporary password an administrator hands over; the user must change it at first sign-in. */
export function generateTemporaryPassword(): string {
  const alphabet = "abcdefghjkmnpqrstuvwxyzABCDEFGHJKMNPQRSTUVWXYZ23456789";
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  const chars = Array.from(bytes, (b) => alphabet[b % alphabet.length]);
  return `${chars.slice(0, 4).join("")}-${chars.slice(4, 8).join("")}-${chars.slice(8, 12).join("")}-${chars.slice(12).join("")}`;
}
