import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { cleaningSystems, systemStages } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { equipmentImpact } from "@/lib/plant/equipment";
import type { SystemInput } from "@/lib/schemas/system";
import { UserFacingError } from "@/lib/server/errors";
import { assertStages, completeStage, stageSummary, stageValues } from "./create-system";
import { effectiveRecipesOn } from "./effective-recipes";

/**
 * Saves a system's name, description and stages; the audit event holds the stages before and
 * after. Once the system runs an effective recipe, its validation rests on the equipment as it
 * was: any change beyond wording is refused here and goes through a change request instead.
 */
export async function updateSystem(actor: AuditActor, typed: SystemInput) {
  await getDb().transaction(async (tx) => {
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
    const before = (
      await tx.select().from(systemStages).where(eq(systemStages.systemId, system.id))
    ).sort((a, b) => a.position - b.position);
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
    const running = await effectiveRecipesOn(tx, system.id);
    if (running.length) {
      const { impact, changes } = equipmentImpact(before, input.stages);
      if (impact !== "editorial") {
        const first = changes.find((c) => c.impact !== "editorial")!;
        throw new UserFacingError(
          `${system.code} runs the effective recipe${running.length === 1 ? "" : "s"} ${running.map((r) => `${r.code} v${r.version}`).join(", ")}: equipment changes go through change control. Open a change request of kind "equipment" (${impact} impact: ${first.stage} — ${first.reason}).`,
        );
      }
    }
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
    });
  });
}
