import "server-only";
import { and, asc, desc, eq, inArray, or } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db/client";
import {
  changeRequests,
  evidenceFiles,
  nonconformanceActions,
  nonconformanceFiles,
  nonconformanceItems,
  nonconformances,
  partFamilies,
  recipes,
  signatures,
  testRuns,
  userRoles,
  users,
} from "@/db/schema";
import { renderRichHtml } from "@/lib/documents/render-html";
import { sanitizeRichHtml } from "@/lib/documents/sanitize";
import type { RichDoc } from "@/lib/documents/rich-text";
import { ncFacts, ncHash } from "./shared";

const owner = alias(users, "owner");

/** Every nonconformance with its recipe, part family and owner, newest first. */
export async function listNonconformances(
  where: { recipeId?: string; partFamilyId?: string } = {},
) {
  return getDb()
    .select({
      id: nonconformances.id,
      number: nonconformances.number,
      title: nonconformances.title,
      severity: nonconformances.severity,
      status: nonconformances.status,
      sourceKind: nonconformances.sourceKind,
      sourceLabel: nonconformances.sourceLabel,
      manualKind: nonconformances.manualKind,
      detectedOn: nonconformances.detectedOn,
      dueOn: nonconformances.dueOn,
      recipeCode: recipes.code,
      familyCode: partFamilies.code,
      owner: owner.name,
    })
    .from(nonconformances)
    .leftJoin(recipes, eq(recipes.id, nonconformances.recipeId))
    .leftJoin(partFamilies, eq(partFamilies.id, nonconformances.partFamilyId))
    .leftJoin(owner, eq(owner.id, nonconformances.ownerId))
    .where(
      and(
        where.recipeId ? eq(nonconformances.recipeId, where.recipeId) : undefined,
        where.partFamilyId ? eq(nonconformances.partFamilyId, where.partFamilyId) : undefined,
      ),
    )
    .orderBy(desc(nonconformances.year), desc(nonconformances.sequence));
}
export type NcListRow = Awaited<ReturnType<typeof listNonconformances>>[number];

/** The nonconformances whose corrective actions opened this change request. */
export async function nonconformancesOfChange(changeRequestId: string) {
  return getDb()
    .selectDistinct({
      id: nonconformances.id,
      number: nonconformances.number,
      title: nonconformances.title,
      status: nonconformances.status,
      severity: nonconformances.severity,
      detectedOn: nonconformances.detectedOn,
    })
    .from(nonconformanceActions)
    .innerJoin(nonconformances, eq(nonconformances.id, nonconformanceActions.nonconformanceId))
    .where(eq(nonconformanceActions.changeRequestId, changeRequestId));
}

/** Everything the detail page shows, read in a handful of queries. */
export async function loadNonconformancePage(id: string) {
  const db = getDb();
  const [row] = await db
    .select({
      nc: nonconformances,
      recipeCode: recipes.code,
      recipeName: recipes.name,
      familyCode: partFamilies.code,
      familyName: partFamilies.name,
      owner: owner.name,
    })
    .from(nonconformances)
    .leftJoin(recipes, eq(recipes.id, nonconformances.recipeId))
    .leftJoin(partFamilies, eq(partFamilies.id, nonconformances.partFamilyId))
    .leftJoin(owner, eq(owner.id, nonconformances.ownerId))
    .where(eq(nonconformances.id, id));
  if (!row) return null;
  const nc = row.nc;
  const recleanRecipe = alias(recipes, "reclean_recipe");
  const letter = alias(evidenceFiles, "letter");
  const items = await db
    .select({
      item: nonconformanceItems,
      run: { id: testRuns.id, outcome: testRuns.outcome, status: testRuns.status },
      recleanRecipe: recleanRecipe.code,
      letterName: letter.originalName,
    })
    .from(nonconformanceItems)
    .leftJoin(
      testRuns,
      and(eq(nonconformanceItems.itemKind, "run"), eq(testRuns.id, nonconformanceItems.itemId)),
    )
    .leftJoin(recleanRecipe, eq(recleanRecipe.id, nonconformanceItems.recleanRecipeId))
    .leftJoin(letter, eq(letter.id, nonconformanceItems.concessionFileId))
    .where(eq(nonconformanceItems.nonconformanceId, id))
    .orderBy(asc(nonconformanceItems.processedAt), asc(nonconformanceItems.label));
  const actions = await db
    .select({
      action: nonconformanceActions,
      owner: users.name,
      changeNumber: changeRequests.number,
      changeStatus: changeRequests.status,
    })
    .from(nonconformanceActions)
    .innerJoin(users, eq(users.id, nonconformanceActions.ownerId))
    .leftJoin(changeRequests, eq(changeRequests.id, nonconformanceActions.changeRequestId))
    .where(eq(nonconformanceActions.nonconformanceId, id))
    .orderBy(asc(nonconformanceActions.createdAt));
  const files = await db
    .select({
      id: evidenceFiles.id,
      name: evidenceFiles.originalName,
      sha256: evidenceFiles.sha256,
    })
    .from(nonconformanceFiles)
    .innerJoin(evidenceFiles, eq(evidenceFiles.id, nonconformanceFiles.fileId))
    .where(eq(nonconformanceFiles.nonconformanceId, id))
    .orderBy(asc(nonconformanceFiles.createdAt));
  const effectivenessRun = nc.effectivenessRunId
    ? (await db.select().from(testRuns).where(eq(testRuns.id, nc.effectivenessRunId)))[0]
    : null;
  const sigs = await db
    .select()
    .from(signatures)
    .where(and(eq(signatures.recordType, "nonconformance"), eq(signatures.recordId, id)))
    .orderBy(asc(signatures.signedAt));
  // Plain reads: a page view takes no write lock.
  const [facts, hash] = await Promise.all([ncFacts(db, nc), ncHash(db, nc)]);
  const engineers = await db
    .select({ id: users.id, name: users.name })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(eq(userRoles.role, "engineer"), eq(users.active, true)))
    .orderBy(asc(users.name));
  const people = await db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.active, true))
    .orderBy(asc(users.name));
  const allRecipes = await db
    .select({ id: recipes.id, code: recipes.code, name: recipes.name })
    .from(recipes)
    .orderBy(asc(recipes.code));
  const sourceRun =
    nc.sourceKind === "run" && nc.sourceId
      ? ((
          await db.select({ id: testRuns.id }).from(testRuns).where(eq(testRuns.id, nc.sourceId))
        )[0] ?? null)
      : null;
  return {
    ...row,
    rootCauseHtml: nc.rootCause ? sanitizeRichHtml(renderRichHtml(nc.rootCause as RichDoc)) : null,
    items,
    actions,
    files,
    effectivenessRun,
    signatures: sigs,
    facts,
    hash,
    engineers,
    people,
    recipes: allRecipes,
    sourceRun,
  };
}
export type NcPage = NonNullable<Awaited<ReturnType<typeof loadNonconformancePage>>>;

/** Open work for queues and reminders: unfinished NCs and their unfinished actions. */
export async function openNcWork() {
  const db = getDb();
  const open = await db
    .select()
    .from(nonconformances)
    .where(
      inArray(nonconformances.status, [
        "open",
        "contained",
        "cause_found",
        "actions_under_way",
        "effectiveness_check",
      ]),
    );
  const actions = open.length
    ? await db
        .select({ action: nonconformanceActions, email: users.email, ownerName: users.name })
        .from(nonconformanceActions)
        .innerJoin(users, eq(users.id, nonconformanceActions.ownerId))
        .where(
          and(
            inArray(
              nonconformanceActions.nonconformanceId,
              open.map((n) => n.id),
            ),
            or(
              eq(nonconformanceActions.status, "open"),
              eq(nonconformanceActions.status, "in_progress"),
            ),
          ),
        )
    : [];
  return { open, actions };
}

/** The recipes and part families a nonconformance reported by hand may name. */
export async function ncFormChoices() {
  const db = getDb();
  const [allRecipes, families] = await Promise.all([
    db
      .select({ id: recipes.id, code: recipes.code, name: recipes.name })
      .from(recipes)
      .orderBy(asc(recipes.code)),
    db
      .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
      .from(partFamilies)
      .orderBy(asc(partFamilies.code)),
  ]);
  return {
    recipes: allRecipes.map((r) => ({ value: r.id, label: `${r.code} · ${r.name}` })),
    families: families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` })),
  };
}

/** The nonconformances a run raised or is held in, for the run's page. */
export async function nonconformancesOfRun(runId: string) {
  return getDb()
    .selectDistinct({
      id: nonconformances.id,
      number: nonconformances.number,
      status: nonconformances.status,
      sourceId: nonconformances.sourceId,
    })
    .from(nonconformances)
    .leftJoin(
      nonconformanceItems,
      and(
        eq(nonconformanceItems.nonconformanceId, nonconformances.id),
        eq(nonconformanceItems.itemKind, "run"),
      ),
    )
    .where(
      or(
        and(eq(nonconformances.sourceKind, "run"), eq(nonconformances.sourceId, runId)),
        eq(nonconformanceItems.itemId, runId),
      ),
    )
    .orderBy(asc(nonconformances.number));
}
