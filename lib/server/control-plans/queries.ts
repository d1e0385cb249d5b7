import "server-only";
import { and, asc, count, desc, eq, inArray, like, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  cleaningSystems,
  controlPlans,
  controlPlanVersions,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  systemStages,
} from "@/db/schema";
import type { ControlPlanStatus } from "@/lib/control-plans/characteristics";
import { combinationName } from "./state";

export const CONTROL_PLAN_PAGE_SIZE = 50;

/** The plan register, one row per combination, newest version's status beside the effective one. */
export async function listControlPlans(query: { q: string; page: number }) {
  const db = getDb();
  const where = query.q
    ? or(like(recipes.code, `%${query.q}%`), like(partFamilies.code, `%${query.q}%`))
    : undefined;
  const base = db
    .select({
      id: controlPlans.id,
      recipeVersionId: controlPlans.recipeVersionId,
      partFamilyId: controlPlans.partFamilyId,
      recipeCode: recipes.code,
      version: recipeVersions.version,
      versionStatus: recipeVersions.status,
      familyCode: partFamilies.code,
      familyName: partFamilies.name,
      systemCode: cleaningSystems.code,
    })
    .from(controlPlans)
    .innerJoin(recipeVersions, eq(recipeVersions.id, controlPlans.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .innerJoin(partFamilies, eq(partFamilies.id, controlPlans.partFamilyId))
    .where(where);
  const [{ total }] = await db
    .select({ total: count() })
    .from(controlPlans)
    .innerJoin(recipeVersions, eq(recipeVersions.id, controlPlans.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, controlPlans.partFamilyId))
    .where(where);
  const rows = await base
    .orderBy(asc(recipes.code), desc(recipeVersions.version), asc(partFamilies.code))
    .limit(CONTROL_PLAN_PAGE_SIZE)
    .offset((query.page - 1) * CONTROL_PLAN_PAGE_SIZE);
  const versions = rows.length
    ? await db
        .select({
          planId: controlPlanVersions.planId,
          version: controlPlanVersions.version,
          status: controlPlanVersions.status,
          effectiveAt: controlPlanVersions.effectiveAt,
        })
        .from(controlPlanVersions)
        .where(
          inArray(
            controlPlanVersions.planId,
            rows.map((r) => r.id),
          ),
        )
        .orderBy(desc(controlPlanVersions.version))
    : [];
  return {
    total,
    rows: rows.map((r) => {
      const mine = versions.filter((v) => v.planId === r.id);
      return {
        ...r,
        combination: combinationName(r.recipeCode, r.version, r.familyCode),
        latest: mine[0] as { version: number; status: ControlPlanStatus } | undefined,
        effective: mine.find((v) => v.status === "effective") ?? null,
      };
    }),
  };
}

/** Qualified combinations that have no plan yet, and each washer's stages (the tanks a bath line reads). */
export async function controlPlanFormOptions() {
  const db = getDb();
  const combos = await db
    .select({
      recipeVersionId: requalificationIntervals.recipeVersionId,
      partFamilyId: requalificationIntervals.partFamilyId,
      recipeCode: recipes.code,
      recipeName: recipes.name,
      version: recipeVersions.version,
      versionStatus: recipeVersions.status,
      familyCode: partFamilies.code,
      familyName: partFamilies.name,
      systemId: recipes.systemId,
      planId: controlPlans.id,
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .leftJoin(
      controlPlans,
      and(
        eq(controlPlans.recipeVersionId, requalificationIntervals.recipeVersionId),
        eq(controlPlans.partFamilyId, requalificationIntervals.partFamilyId),
      ),
    )
    .where(sql`${controlPlans.id} is null`)
    .orderBy(asc(recipes.code), desc(recipeVersions.version), asc(partFamilies.code));
  const systemIds = [...new Set(combos.map((c) => c.systemId))];
  const stages = systemIds.length
    ? await db
        .select({
          id: systemStages.id,
          systemId: systemStages.systemId,
          name: systemStages.name,
          position: systemStages.position,
        })
        .from(systemStages)
        .where(inArray(systemStages.systemId, systemIds))
        .orderBy(asc(systemStages.position))
    : [];
  return {
    combinations: combos.map((c) => ({
      value: `${c.recipeVersionId}:${c.partFamilyId}`,
      label: `${combinationName(c.recipeCode, c.version, c.familyCode)} (${c.familyName}; recipe version ${c.versionStatus})`,
      systemId: c.systemId,
    })),
    tanks: stages,
  };
}

/** Plans of a recipe version or a part family, for links from their pages. */
export async function controlPlansOf(filter: { recipeVersionId?: string; partFamilyId?: string }) {
  const db = getDb();
  const conditions = [];
  if (filter.recipeVersionId)
    conditions.push(eq(controlPlans.recipeVersionId, filter.recipeVersionId));
  if (filter.partFamilyId) conditions.push(eq(controlPlans.partFamilyId, filter.partFamilyId));
  const rows = await db
    .select({
      id: controlPlans.id,
      recipeCode: recipes.code,
      version: recipeVersions.version,
      familyCode: partFamilies.code,
    })
    .from(controlPlans)
    .innerJoin(recipeVersions, eq(recipeVersions.id, controlPlans.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, controlPlans.partFamilyId))
    .where(and(...conditions))
    .orderBy(asc(recipes.code), asc(partFamilies.code))
    .limit(100);
  return rows.map((r) => ({
    id: r.id,
    name: combinationName(r.recipeCode, r.version, r.familyCode),
  }));
}
