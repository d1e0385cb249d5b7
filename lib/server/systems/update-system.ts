import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { cleaningSystems, systemStages, type CleaningSystem, type SystemStage } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { equipmentImpact } from "@/lib/plant/equipment";
import type { SystemInput } from "@/lib/schemas/system";
import { UserFacingError } from "@/lib/server/errors";
import { assertStages, completeStage, stageSummary, stageValues } from "./create-system";
import { effectiveRecipesOn } from "./effective-recipes";
import { openEquipmentChange } from "./equipment-change";

/**
 * Saves a system's name, description and stages; the audit event holds the stages before and
 * after. Once the system runs an effective recipe, its validation rests on the equipment as it
 * was: a change beyond wording is not saved but opens a change request of kind "equipment" on the
 * recipe, which writes the new equipment when it closes. Returns that change request, if any.
 */
export async function updateSystem(
  actor: AuditActor & { id: string },
  typed: SystemInput,
): Promise<{ changeRequestId: string | null }> {
  return getDb().transaction(async (tx) => {
    const [system] = await tx
      .select()
      .from(cleaningSystems)
      .where(eq(cleaningSystems.id, typed.systemId));
    if (!system)
      throw new UserFacingError("That cleaning system does not exist.", { kind: "not_found" });
    if (!system.active)
      throw new UserFacingError(`${system.code} is retired: it cannot be edited.`, {
        kind: "locked",
      });
    const before = await stagesOf(tx, system.id);
    const input = completeInput(typed, before);
    const running = await effectiveRecipesOn(tx, system.id);
    if (running.length) {
      const { impact } = equipmentImpact(before, input.stages);
      if (impact !== "editorial") {
        assertStages(input.stages);
        const cr = await openEquipmentChange(tx, actor, { system, before, input, running });
        return { changeRequestId: cr.id };
      }
    }
    await writeSystem(tx, actor, system, before, input, null);
    return { changeRequestId: null };
  });
}

export async function stagesOf(tx: Tx, systemId: string) {
  return (await tx.select().from(systemStages).where(eq(systemStages.systemId, systemId))).sort(
    (a, b) => a.position - b.position,
  );
}

/** The edit with each equipment field left out taken from the stored stage; removing a stage is refused. */
export function completeInput(typed: SystemInput, before: SystemStage[]) {
  const input = {
    ...typed,
    stages: typed.stages.map((s) =>
      completeStage(
        s,
        before.find((b) => b.id === s.id),
      ),
    ),
  };
  const kept = input.stages.filter((s) => s.id).map((s) => s.id);
  const missing = before.filter((b) => !kept.includes(b.id));
  if (missing.length)
    throw new UserFacingError(
      `Stages are kept once created: ${missing.map((m) => m.name).join(", ")} cannot be removed.`,
      { kind: "invalid" },
    );
  return input;
}

/** Writes the system's name, description and stages with the audit event; `reason` names the change request that allowed it. */
export async function writeSystem(
  tx: Tx,
  actor: AuditActor,
  system: CleaningSystem,
  before: SystemStage[],
  input: ReturnType<typeof completeInput>,
  reason: string | null,
) {
  assertStages(input.stages);
  await tx
    .update(cleaningSystems)
    .set({ name: input.name, description: input.description })
    .where(eq(cleaningSystems.id, system.id));
  // Positions are unique per system: park existing stages out of the way, then write the new order.
  for (const b of before)
    await tx
      .update(systemStages)
      .set({ position: b.position + 1000 })
      .where(eq(systemStages.id, b.id));
  for (const [i, s] of input.stages.entries()) {
    const { systemId: _s, ...values } = stageValues(s, system.id, i + 1);
    if (s.id) {
      const [row] = await tx
        .update(systemStages)
        .set(values)
        .where(and(eq(systemStages.id, s.id), eq(systemStages.systemId, system.id)))
        .returning();
      if (!row)
        throw new UserFacingError("A stage does not belong to this system. Reload the page.", {
          kind: "invalid",
        });
    } else {
      await tx.insert(systemStages).values(stageValues(s, system.id, i + 1));
    }
  }
  await appendAudit(tx, actor, {
    eventType: "cleaning_system.updated",
    recordType: "cleaning_system",
    recordId: system.id,
    old: { name: system.name, description: system.description, stages: before.map(stageSummary) },
    new: {
      name: input.name,
      description: input.description,
      stages: input.stages.map(stageSummary),
    },
    reason,
  });
}
