// Not "server-only": the demo seed creates its control plan through `createControlPlanIn` under tsx.
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { controlPlans, controlPlanVersions, requalificationIntervals } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { CreateControlPlanInput } from "@/lib/schemas/control-plan";
import { UserFacingError } from "@/lib/server/errors";
import { assertLinesFit, insertLines } from "./lines";
import { controlPlanContentHash, loadCombination } from "./state";

/**
 * Drafts version 1 of the control plan of a qualified combination. A combination that is not
 * qualified, or already has a plan, is refused beside the field; so is a tank of another washer.
 */
export async function createControlPlanIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: CreateControlPlanInput,
  now = new Date(),
) {
  const [recipeVersionId, partFamilyId] = input.combination.split(":");
  const [qualified] = await tx
    .select({ id: requalificationIntervals.id })
    .from(requalificationIntervals)
    .where(
      and(
        eq(requalificationIntervals.recipeVersionId, recipeVersionId),
        eq(requalificationIntervals.partFamilyId, partFamilyId),
      ),
    );
  const combination = await loadCombination(tx, recipeVersionId, partFamilyId);
  if (!qualified || !combination)
    throw new UserFacingError(
      "That recipe version is not qualified for that part family: a control plan keeps a qualified combination in its validated state.",
      { kind: "invalid", field: "combination" },
    );
  const [existing] = await tx
    .select({ id: controlPlans.id })
    .from(controlPlans)
    .where(
      and(
        eq(controlPlans.recipeVersionId, recipeVersionId),
        eq(controlPlans.partFamilyId, partFamilyId),
      ),
    );
  if (existing)
    throw new UserFacingError(
      `${combination.name} already has a control plan: revise it instead of starting another.`,
      { kind: "conflict", field: "combination" },
    );
  await assertLinesFit(tx, combination.systemId, input.lines);
  const at = now.toISOString();
  const [plan] = await tx
    .insert(controlPlans)
    .values({ recipeVersionId, partFamilyId, createdBy: actor.id, createdAt: at })
    .returning();
  const [version] = await tx
    .insert(controlPlanVersions)
    .values({
      planId: plan.id,
      version: 1,
      status: "draft",
      note: "First issue",
      createdBy: actor.id,
      createdAt: at,
    })
    .returning();
  const lines = await insertLines(tx, version.id, input.lines);
  await appendAudit(
    tx,
    actor,
    {
      eventType: "control_plan.created",
      recordType: "control_plan_version",
      recordId: version.id,
      new: {
        combination: combination.name,
        version: 1,
        lines: lines.length,
        contentHash: controlPlanContentHash(plan, 1, lines),
      },
    },
    now,
  );
  return { planId: plan.id, versionId: version.id };
}

export async function createControlPlan(
  actor: { id: string; name: string },
  input: CreateControlPlanInput,
  now = new Date(),
) {
  return getDb().transaction((tx) => createControlPlanIn(tx, actor, input, now));
}
