import "server-only";
import { and, desc, eq, notInArray } from "drizzle-orm";
import type { Database, Tx } from "@/db/client";
import { passwordHistory } from "@/db/schema";
import { verifyPassword } from "@/lib/auth/password";
import { PASSWORD_HISTORY } from "@/lib/schemas/account";

/** True when the password is the current one or one of the earlier ones kept (the last PASSWORD_HISTORY in all). */
export async function usedRecently(
  db: Database | Tx,
  user: { id: string; passwordHash: string },
  password: string,
): Promise<boolean> {
  const earlier = await db
    .select({ hash: passwordHistory.passwordHash })
    .from(passwordHistory)
    .where(eq(passwordHistory.userId, user.id))
    .orderBy(desc(passwordHistory.createdAt), desc(passwordHistory.id))
    .limit(PASSWORD_HISTORY - 1);
  for (const hash of [user.passwordHash, ...earlier.map((e) => e.hash)]) {
    if (await verifyPassword(hash, password)) return true;
  }
  return false;
}

/**
 * Keeps the hash being replaced, and forgets older ones beyond what the rule needs:
 * an old hash is still a secret worth not keeping for ever.
 */
export async function rememberPassword(tx: Tx, userId: string, oldHash: string, now: Date) {
  await tx
    .insert(passwordHistory)
    .values({ userId, passwordHash: oldHash, createdAt: now.toISOString() });
  const keep = await tx
    .select({ id: passwordHistory.id })
    .from(passwordHistory)
    .where(eq(passwordHistory.userId, userId))
    .orderBy(desc(passwordHistory.createdAt), desc(passwordHistory.id))
    .limit(PASSWORD_HISTORY - 1);
  await tx.delete(passwordHistory).where(
    and(
      eq(passwordHistory.userId, userId),
      notInArray(
        passwordHistory.id,
        keep.map((k) => k.id),
      ),
    ),
  );
}
