import "server-only";
import { getDb } from "@/db/client";
import { controlPlanVersions } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { insertLines } from "./lines";
import { controlPlanContentHash, loadControlPlan } from "./state";

/**
 * Opens the next version as a draft with the effective version's lines; the effective one stays
 * in force (and keeps its signatures) until the new one is approved.
 */
export async function reviseControlPlan(
  actor: { id: string; name: string },
  input: { planId: string; note: string },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const view = await loadControlPlan(tx, input.planId);
    if (view.open)
      throw new UserFacingError(
        `Version ${view.open.version} is still open (${view.open.status.replace("_", " ")}): finish or send it back first.`,
      );
    const from = view.versions[0];
    const next = from.version + 1;
    const [version] = await tx
      .insert(controlPlanVersions)
      .values({
        planId: view.plan.id,
        version: next,
        status: "draft",
        note: input.note,
        createdBy: actor.id,
        createdAt: now.toISOString(),
      })
      .returning();
    const lines = await insertLines(
      tx,
      version.id,
      from.lines.map((l) => ({
        characteristic: l.characteristic,
        method: l.method,
        stageId: l.stageId,
        sampleSize: l.sampleSize,
        minCycles: l.minCycles,
        frequency: l.frequency,
        everyN: l.everyN,
        reactionPlan: l.reactionPlan,
      })),
    );
    await appendAudit(
      tx,
      actor,
      {
        eventType: "control_plan.revised",
        recordType: "control_plan_version",
        recordId: version.id,
        new: {
          combination: view.combination.name,
          version: next,
          fromVersion: from.version,
          note: input.note,
          contentHash: controlPlanContentHash(view.plan, next, lines),
        },
      },
      now,
    );
    return { versionId: version.id };
  });
}
