// Not "server-only": the demo seed calls `saveDetergentIn` under tsx.
import { eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { detergents } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { DetergentInput } from "@/lib/schemas/bath-plan";

/**
 * Adds a detergent to the register, or changes the factor of one already there (by name): a new
 * data sheet changes the factor, and the audit event keeps the one earlier readings used.
 */
export async function saveDetergent(
  actor: { id: string; name: string },
  input: DetergentInput,
  now = new Date(),
) {
  return getDb().transaction((tx) => saveDetergentIn(tx, actor, input, now));
}

export async function saveDetergentIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: DetergentInput,
  now = new Date(),
) {
  const [existing] = await tx.select().from(detergents).where(eq(detergents.name, input.name));
  const values = {
    name: input.name,
    supplier: input.supplier ?? null,
    titrationMethod: input.titrationMethod ?? null,
    factorPctPerMl: input.factorPctPerMl,
  };
  const [row] = existing
    ? await tx
        .update(detergents)
        .set({ ...values, updatedAt: now.toISOString() })
        .where(eq(detergents.id, existing.id))
        .returning()
    : await tx
        .insert(detergents)
        .values({ ...values, createdBy: actor.id, createdAt: now.toISOString() })
        .returning();
  await appendAudit(tx, actor, {
    eventType: "detergent.saved",
    recordType: "detergent",
    recordId: row.id,
    old: existing
      ? {
          name: existing.name,
          supplier: existing.supplier,
          titrationMethod: existing.titrationMethod,
          factorPctPerMl: existing.factorPctPerMl,
        }
      : null,
    new: values,
  });
  return row;
}
