import "server-only";
import { asc, desc, eq, inArray } from "drizzle-orm";
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
import { loadNarratives } from "./snapshot";
import { loadChangeSubjects } from "./subjects";
import { loadRecipeSnapshots } from "@/db/recipe-content";

/** What an initial validation compares the new recipe with: nothing was validated before it. */
export const NO_RECIPE: RecipeSnapshot = { detergent: null, notes: null, stages: [] };

export async function getEffectiveMatrix(db: Executor) {
  const [matrix] = await db
    .select()
    .from(requalificationMatrices)
    .where(eq(requalificationMatrices.status, "effective"))
    .orderBy(desc(requalificationMatrices.version))
    .limit(1);
  if (!matrix) return null;
  const rows = await db
    .select()
    .from(requalificationMatrixRows)
    .where(eq(requalificationMatrixRows.matrixId, matrix.id))
    .orderBy(asc(requalificationMatrixRows.subject), asc(requalificationMatrixRows.testType));
  return {
    ...matrix,
    rows: rows.map((r): MatrixRow & { id: string } => ({
      id: r.id,
      subject: r.subject as MatrixSubject,
      testType: r.testType as TestType,
      confidencePct: r.confidencePct,
      reliabilityPct: r.reliabilityPct,
      minCycles: r.minCycles,
    })),
  };
}

/**
 * Everything one change request is: the proposal against the effective version,
 * the assessment (live while a draft, frozen once submitted), the narrative and
 * the hash its signatures bind to. Pages and services read it the same way, so the
 * hash shown in the signing dialog is the hash the server checks.
 */
export async function loadChangeState(db: Executor, changeRequestId: string) {
  return (await loadChangeStates(db, [changeRequestId])).get(changeRequestId)!;
}

/**
 * loadChangeState for several change requests in a fixed number of statements (a parameter's
 * trace shows every change that touched it). Throws, as loadChangeState does, when one of them
 * does not exist or has no versions to compare.
 */
export async function loadChangeStates(db: Executor, changeRequestIds: string[]) {
  const ids = [...new Set(changeRequestIds)];
  // Sequential awaits: the executor may be a transaction, which runs one statement at a time.
  const rows = ids.length
    ? await db
        .select({ cr: changeRequests, a: changeRequestAssessments, recipe: recipes })
        .from(changeRequests)
        .innerJoin(
          changeRequestAssessments,
          eq(changeRequestAssessments.changeRequestId, changeRequests.id),
        )
        .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
        .where(inArray(changeRequests.id, ids))
    : [];
  const rowOf = new Map(rows.map((r) => [r.cr.id, r]));
  for (const id of ids) {
    const row = rowOf.get(id);
    if (!row)
      throw new UserFacingError("That change request does not exist.", { kind: "not_found" });
    // Only an initial validation has no "from": the recipe's first version is compared with nothing.
    const initial = row.a.kind === "initial_validation";
    if ((!row.cr.fromVersionId && !initial) || !row.cr.toVersionId)
      throw new UserFacingError("This change request has no recipe versions to compare.");
  }
  const versionIds = rows
    .flatMap((r) => [r.cr.fromVersionId, r.cr.toVersionId!])
    .filter((v): v is string => v !== null);
  const versions = versionIds.length
    ? await db.select().from(recipeVersions).where(inArray(recipeVersions.id, versionIds))
    : [];
  const snapshots = await loadRecipeSnapshots(db, versionIds);
  const familyIds = [
    ...new Set(rows.map((r) => r.a.partFamilyId).filter((f): f is string => f !== null)),
  ];
  const families = familyIds.length
    ? await db.select().from(partFamilies).where(inArray(partFamilies.id, familyIds))
    : [];
  const matrix = rows.some((r) => r.cr.status === "draft") ? await getEffectiveMatrix(db) : null;
  const submitted = rows.filter((r) => r.cr.status !== "draft").map((r) => r.cr.id);
  const allStored = submitted.length
    ? await db
        .select()
        .from(changeRequestTests)
        .where(inArray(changeRequestTests.changeRequestId, submitted))
        .orderBy(asc(changeRequestTests.testType))
    : [];
  const narratives = await loadNarratives(
    db,
    rows.map((r) => r.cr.narrativeDocumentId),
  );

  const subjects = await loadChangeSubjects(db, ids, matrix?.rows ?? []);

  const build = (id: string) => {
    const { cr, a, recipe } = rowOf.get(id)!;
    const initial = a.kind === "initial_validation";
    // The foreign keys guarantee the versions named exist.
    const fromVersion = cr.fromVersionId ? versions.find((v) => v.id === cr.fromVersionId)! : null;
    const toVersion = versions.find((v) => v.id === cr.toVersionId)!;
    const from = cr.fromVersionId ? snapshots.get(cr.fromVersionId)! : NO_RECIPE;
    const to = snapshots.get(cr.toVersionId!)!;
    const family = a.partFamilyId ? families.find((f) => f.id === a.partFamilyId) : undefined;
    const newPartFamily = addsPartFamily(a.kind) && family ? `${family.code} ${family.name}` : null;
    const draftMatrix = cr.status === "draft" ? matrix : null;
    const subject = subjects.get(cr.id) ?? null;
    const assessment = assess({
      from,
      to,
      newPartFamily,
      initial,
      raisedTo: a.raisedTo,
      matrix: draftMatrix?.rows ?? [],
      subject: subject?.assessment,
    });
    // Once submitted, the required tests are the ones frozen at submission, not a re-reading of a later matrix.
    const stored =
      cr.status === "draft" ? [] : allStored.filter((t) => t.changeRequestId === cr.id);
    const requirements =
      cr.status === "draft"
        ? assessment.tests.map((t) => ({
            testType: t.testType,
            samples: t.samples,
            confidencePct: t.confidencePct,
            reliabilityPct: t.reliabilityPct,
            minCycles: t.minCycles as number | null,
            because: t.because,
          }))
        : stored.map((t) => ({
            testType: t.testType as TestType,
            samples: t.samples,
            confidencePct: t.confidencePct,
            reliabilityPct: t.reliabilityPct,
            minCycles: t.minCycles,
            because: t.because,
          }));
    const narrative = cr.narrativeDocumentId
      ? (narratives.get(cr.narrativeDocumentId) ?? null)
      : null;
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
      // Only a change with a subject carries the key, so the hashes signed before it came stay valid.
      ...(subject ? { subject: { kind: subject.kind, changes: subject.changes } } : {}),
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
      /** What the change changes besides the recipe (equipment, a specification), or null. */
      subject,
      assessment,
      impact,
      requirements,
      matrixVersion: draftMatrix?.version ?? null,
      matrixId: draftMatrix?.id ?? null,
      narrative,
      contentHash,
      /** Signatures of this revision are filed under this record id. */
      signatureRecordId: `${cr.id}#${a.revision}`,
    };
  };
  return new Map(ids.map((id) => [id, build(id)] as const));
}

export type ChangeState = Awaited<ReturnType<typeof loadChangeState>>;
