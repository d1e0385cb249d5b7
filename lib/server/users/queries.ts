import "server-only";
import { asc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { userRoles, users, type Role } from "@/db/schema";

export interface UserRow {
  id: string;
  name: string;
  email: string;
  jobTitle: string | null;
  active: boolean;
  locked: boolean;
  mustChangePassword: boolean;
  roles: Role[];
}

function toRow(u: typeof users.$inferSelect, roles: Role[], now: Date): UserRow {
  return {
    id: u.id,
    name: u.name,
    email: u.email,
    jobTitle: u.jobTitle,
    active: u.active,
    locked: u.lockedUntil !== null && new Date(u.lockedUntil) > now,
    mustChangePassword: u.mustChangePassword,
    roles: roles.sort(),
  };
}

export async function listUsers(now = new Date()): Promise<UserRow[]> {
  const db = getDb();
  const rows = await db.select().from(users).orderBy(asc(users.name));
  const roles = await db.select().from(userRoles);
  return rows.map((u) =>
    toRow(
      u,
      roles.filter((r) => r.userId === u.id).map((r) => r.role),
      now,
    ),
  );
}

export async function getUser(userId: string, now = new Date()): Promise<UserRow | undefined> {
  const db = getDb();
  const [u] = await db.select().from(users).where(eq(users.id, userId));
  if (!u) return undefined;
  const roles = await db.select().from(userRoles).where(eq(userRoles.userId, userId));
  return toRow(
    u,
    roles.map((r) => r.role),
    now,
  );
}
