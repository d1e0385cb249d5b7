import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { cleaningSystems, systemStages } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { SystemInput } from "@/lib/schemas/system";
import { UserFacingError } from "@/lib/server/errors";

/** Saves a system's name, description and stages; the audit event holds the stages before and after. */
export async function updateSystem(actor: AuditActor, input: SystemInput) {
  await getDb().transaction(async (tx) => {
    const [system] = await tx.select().from(cleaningSystems).where(eq(cleaningSystems.id, input.systemId));
    if (!system) throw new UserFacingError("That cleaning system does not exist.", { kind: "not_found" });
    const before = await tx.select().from(systemStages).where(eq(systemStages.systemId, system.id));
    const kept = input.stages.filter((s) => s.id).map((s) => s.id);
    const missing = before.filter((b) => !kept.includes(b.id));
    if (missing.length) throw new UserFacingError(`Stages are kept once created: ${missing.map((m) => m.name).join(", ")} cannot be removed.`, { kind: "invalid" });
    await tx.update(cleaningSystems).set({ name: input.name, description: input.description }).where(eq(cleaningSystems.id, system.id));
    // Positions are unique per system: park existing stages out of the way, then write the new order.
    for (const b of before) await tx.update(systemStages).set({ position: b.position + 1000 }).where(eq(systemStages.id, b.id));
    for (const [i, s] of input.stages.entries()) {
      const values = { name: s.name, kind: s.kind, capabilities: s.capabilities, tankVolumeL: s.tankVolumeL, position: i + 1 };
      if (s.id) {
        const [row] = await tx.update(systemStages).set(values).where(and(eq(systemStages.id, s.id), eq(systemStages.systemId, system.id))).returning();
        if (!row) throw new UserFacingError("A stage does not belong to this system. Reload the page.", { kind: "invalid" });
      } else {
        await tx.insert(systemStages).values({ ...values, systemId: system.id });
      }
    }
    const summary = (stages: { name: string; kind: string; capabilities: string[]; tankVolumeL: number | null }[]) =>
      stages.map((s) => `${s.name} (${s.kind}; ${s.capabilities.join(", ")}${s.tankVolumeL ? `; ${s.tankVolumeL} L` : ""})`);
    await appendAudit(tx, actor, {
      eventType: "cleaning_system.updated",
      recordType: "cleaning_system",
      recordId: system.id,
      old: { name: system.name, description: system.description, stages: summary(before.sort((a, b) => a.position - b.position)) },
      new: { name: input.name, description: input.description, stages: summary(input.stages) },
    });
  });
}
