import "server-only";
import { eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { emergencyChanges, users, type EmergencyChange } from "@/db/schema";

/** The emergency record of each change that has one (lists, queue, trace and page mark them). */
export async function loadEmergencies(
  db: Executor,
  changeRequestIds: string[],
): Promise<Map<string, EmergencyChange & { implementedByName: string }>> {
  if (changeRequestIds.length === 0) return new Map();
  const rows = await db
    .select({ e: emergencyChanges, name: users.name })
    .from(emergencyChanges)
    .innerJoin(users, eq(users.id, emergencyChanges.implementedBy))
    .where(inArray(emergencyChanges.changeRequestId, changeRequestIds));
  return new Map(rows.map((r) => [r.e.changeRequestId, { ...r.e, implementedByName: r.name }]));
}
