// Not "server-only": the demo seed runs the control-plan services under tsx.
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  cleaningSystems,
  controlPlanLines,
  controlPlans,
  controlPlanVersions,
  partFamilies,
  recipes,
  recipeVersions,
  signatures,
  systemStages,
  users,
  type ControlPlanLine,
} from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { notFoundError } from "@/lib/server/errors";

type LineContent = Pick<
  ControlPlanLine,
  | "characteristic"
  | "method"
  | "stageId"
  | "sampleSize"
  | "minCycles"
  | "frequency"
  | "everyN"
  | "reactionPlan"
>;

/** What the signatures of a version bind to: the combination, the version and its lines in order. */
export function controlPlanContentHash(
  plan: { recipeVersionId: string; partFamilyId: string },
  version: number,
  lines: readonly LineContent[],
): string {
  return sha256Hex(
    canonicalJson({
      recipeVersionId: plan.recipeVersionId,
      partFamilyId: plan.partFamilyId,
      version,
      lines: lines.map((l) => ({
        characteristic: l.characteristic,
        method: l.method,
        stageId: l.stageId,
        sampleSize: l.sampleSize,
        minCycles: l.minCycles,
        frequency: l.frequency,
        everyN: l.everyN,
        reactionPlan: l.reactionPlan,
      })),
    }),
  );
}

/** "VB-STD version 2 × VB-100": how a combination is named on screens and in the trail. */
export function combinationName(recipeCode: string, version: number, familyCode: string) {
  return `${recipeCode} version ${version} × ${familyCode}`;
}

/** The combination a plan belongs to, with its washer (whose site's shifts the plan follows). */
export async function loadCombination(db: Executor, recipeVersionId: string, partFamilyId: string) {
  const [row] = await db
    .select({
      recipeId: recipes.id,
      recipeCode: recipes.code,
      recipeName: recipes.name,
      version: recipeVersions.version,
      versionStatus: recipeVersions.status,
      systemId: cleaningSystems.id,
      systemCode: cleaningSystems.code,
      siteId: cleaningSystems.siteId,
    })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(eq(recipeVersions.id, recipeVersionId));
  const [family] = await db
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .where(eq(partFamilies.id, partFamilyId));
  if (!row || !family) return null;
  return { ...row, family, name: combinationName(row.recipeCode, row.version, family.code) };
}

/** One plan as its page and every step read it, so the hash shown is the hash checked. */
export async function loadControlPlan(db: Executor, planId: string) {
  const [plan] = await db.select().from(controlPlans).where(eq(controlPlans.id, planId));
  if (!plan) throw notFoundError("That control plan does not exist.");
  const combination = await loadCombination(db, plan.recipeVersionId, plan.partFamilyId);
  if (!combination) throw notFoundError("That control plan's combination no longer exists.");
  const versionRows = await db
    .select({ v: controlPlanVersions, author: users.name })
    .from(controlPlanVersions)
    .innerJoin(users, eq(users.id, controlPlanVersions.createdBy))
    .where(eq(controlPlanVersions.planId, planId))
    .orderBy(desc(controlPlanVersions.version));
  const ids = versionRows.map((r) => r.v.id);
  const lineRows = ids.length
    ? await db
        .select({ line: controlPlanLines, tank: systemStages.name })
        .from(controlPlanLines)
        .leftJoin(systemStages, eq(systemStages.id, controlPlanLines.stageId))
        .where(inArray(controlPlanLines.versionId, ids))
        .orderBy(asc(controlPlanLines.position))
    : [];
  const sigs = ids.length
    ? await db
        .select()
        .from(signatures)
        .where(
          and(eq(signatures.recordType, "control_plan_version"), inArray(signatures.recordId, ids)),
        )
        .orderBy(asc(signatures.signedAt))
    : [];
  const tanks = await db
    .select({ id: systemStages.id, name: systemStages.name, position: systemStages.position })
    .from(systemStages)
    .where(eq(systemStages.systemId, combination.systemId))
    .orderBy(asc(systemStages.position));
  const versions = versionRows.map(({ v, author }) => {
    const lines = lineRows.filter((l) => l.line.versionId === v.id);
    return {
      ...v,
      author,
      lines: lines.map((l) => ({ ...l.line, tank: l.tank })),
      signatures: sigs.filter((s) => s.recordId === v.id),
      contentHash: controlPlanContentHash(
        plan,
        v.version,
        lines.map((l) => l.line),
      ),
    };
  });
  return {
    plan,
    combination,
    versions,
    tanks,
    effective: versions.find((v) => v.status === "effective") ?? null,
    open: versions.find((v) => ["draft", "in_review", "reviewed"].includes(v.status)) ?? null,
  };
}
export type ControlPlanView = Awaited<ReturnType<typeof loadControlPlan>>;

/** The plan a version belongs to, loaded whole. */
export async function loadControlPlanOfVersion(db: Executor, versionId: string) {
  const [row] = await db
    .select({ planId: controlPlanVersions.planId })
    .from(controlPlanVersions)
    .where(eq(controlPlanVersions.id, versionId));
  if (!row) throw notFoundError("That control plan version does not exist.");
  const view = await loadControlPlan(db, row.planId);
  return { view, version: view.versions.find((v) => v.id === versionId)! };
}
