import "server-only";
import { asc, desc, eq } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequests,
  changeRequestTests,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationMatrices,
  requalificationMatrixRows,
} from "@/db/schema";
import { assess } from "@/lib/changes/assess";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import { addsPartFamily } from "@/lib/changes/workflow";
import type { MatrixRow } from "@/lib/changes/requalification";
import type { MatrixSubject, TestType } from "@/lib/recipes/test-types";
import { UserFacingError } from "@/lib/server/errors";
import { changeContentHash } from "@/lib/changes/content";
import { loadNarrative, loadRecipeSnapshot } from "./snapshot";

/** What an initial validation compares the new recipe with: nothing was validated before it. */
export const NO_RECIPE: RecipeSnapshot = { detergent: null, notes: null, stages: [] };

export async function getEffectiveMatrix(db: Executor) {
  const [matrix] = await db.select().from(requalificationMatrices).where(eq(requalificationMatrices.status, "effective")).orderBy(desc(requalificationMatrices.version)).limit(1);
  if (!matrix) return null;
  const rows = await db.select().from(requalificationMatrixRows).where(eq(requalificationMatrixRows.matrixId, matrix.id)).orderBy(asc(requalificationMatrixRows.subject), asc(requalificationMatrixRows.testType));
  return { ...matrix, rows: rows.map((r): MatrixRow & { id: string } => ({ id: r.id, subject: r.subject as MatrixSubject, testType: r.testType as TestType, confidencePct: r.confidencePct, reliabilityPct: r.reliabilityPct })) };
}

/**
 * Everything one change request is: the proposal against the effective version,
 * the assessment (live while a draft, frozen once submitted), the narrative and
 * the hash its signatures bind to. Pages and services read it the same way, so the
 * hash shown in the signing dialog is the hash the server checks.
 */
export async function loadChangeState(db: Executor, changeRequestId: string) {
  const [row] = await db
    .select({ cr: changeRequests, a: changeRequestAssessments, recipe: recipes })
    .from(changeRequests)
    .innerJoin(changeRequestAssessments, eq(changeRequestAssessments.changeRequestId, changeRequests.id))
    .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
    .where(eq(changeRequests.id, changeRequestId));
  if (!row) throw new UserFacingError("That change request does not exist.", { kind: "not_found" });
  const { cr, a, recipe } = row;
  // Only an initial validation has no "from": the recipe's first version is compared with nothing.
  const initial = a.kind === "initial_validation";
  if ((!cr.fromVersionId && !initial) || !cr.toVersionId) throw new UserFacingError("This change request has no recipe versions to compare.");
  const fromVersion = cr.fromVersionId ? ((await db.select().from(recipeVersions).where(eq(recipeVersions.id, cr.fromVersionId)))[0] ?? null) : null;
  const [toVersion] = await db.select().from(recipeVersions).where(eq(recipeVersions.id, cr.toVersionId));
  const [from, to] = await Promise.all([cr.fromVersionId ? loadRecipeSnapshot(db, cr.fromVersionId) : NO_RECIPE, loadRecipeSnapshot(db, cr.toVersionId)]);
  const family = a.partFamilyId ? (await db.select().from(partFamilies).where(eq(partFamilies.id, a.partFamilyId)))[0] : undefined;
  const newPartFamily = addsPartFamily(a.kind) && family ? `${family.code} ${family.name}` : null;

  const matrix = cr.status === "draft" ? await getEffectiveMatrix(db) : null;
  const assessment = assess({ from, to, newPartFamily, initial, raisedTo: a.raisedTo, matrix: matrix?.rows ?? [] });
  // Once submitted, the required tests are the ones frozen at submission, not a re-reading of a later matrix.
  const stored = cr.status === "draft" ? [] : await db.select().from(changeRequestTests).where(eq(changeRequestTests.changeRequestId, cr.id)).orderBy(asc(changeRequestTests.testType));
  const requirements =
    cr.status === "draft"
      ? assessment.tests.map((t) => ({ testType: t.testType, samples: t.samples, confidencePct: t.confidencePct, reliabilityPct: t.reliabilityPct, because: t.because }))
      : stored.map((t) => ({ testType: t.testType as TestType, samples: t.samples, confidencePct: t.confidencePct, reliabilityPct: t.reliabilityPct, because: t.because }));
  const narrative = await loadNarrative(db, cr.narrativeDocumentId);
  const impact = cr.status === "draft" ? assessment.impact : (cr.impact ?? assessment.impact);
  const contentHash = changeContentHash({
    number: cr.number,
    title: cr.title,
    kind: a.kind,
    partFamilyId: a.partFamilyId,
    fromVersionId: cr.fromVersionId,
    proposal: to,
    narrative: narrative?.content ?? null,
    impact,
    raiseReason: a.raiseReason,
    requirements: requirements.map((r) => ({ testType: r.testType, samples: r.samples })),
  });
  return {
    cr,
    assessmentRow: a,
    recipe,
    fromVersion,
    toVersion,
    from,
    to,
    family: family ?? null,
    assessment,
    impact,
    requirements,
    matrixVersion: matrix?.version ?? null,
    matrixId: matrix?.id ?? null,
    narrative,
    contentHash,
    /** Signatures of this revision are filed under this record id. */
    signatureRecordId: `${cr.id}#${a.revision}`,
  };
}
export type ChangeState = Awaited<ReturnType<typeof loadChangeState>>;
