// The trace of one parameter as it was read before it was batched: one change request at a time
// through the single-record loaders. Kept only so a test can check the batched read returns
// exactly the same answer. The loaders below are copies of the single-record ones as they were.
import { showsEmergency } from "@/lib/changes/emergency";
import { loadEmergencies } from "@/lib/server/changes/emergencies";
import { and, asc, desc, eq, gte, inArray, lt, or, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequestEvidence,
  changeRequests,
  changeRequestTests,
  cleaningSystems,
  documentVersions,
  evidenceFiles,
  partFamilies,
  recipeParameters,
  recipes,
  recipeStages,
  recipeVersions,
  requalificationMatrices,
  requalificationMatrixRows,
  signatures,
  testRuns,
  testSamples,
  users,
} from "@/db/schema";
import { assess } from "@/lib/changes/assess";
import { changeContentHash } from "@/lib/changes/content";
import type { RecipeSnapshot } from "@/lib/changes/diff";
import type { MatrixRow } from "@/lib/changes/requalification";
import type { MatrixSubject, TestType } from "@/lib/recipes/test-types";
import { UserFacingError } from "@/lib/server/errors";
import { narrativeText } from "@/lib/changes/content";
import { buildParameterTimeline, type VersionValue } from "@/lib/trace/timeline";
import { signatureValidity } from "@/lib/signatures/rules";
import { excerpt, versionValidations } from "@/lib/server/trace/parameter-history";

/**
 * The whole history of one recipe parameter: each value and validated range it has
 * had, when it was in force, and for each change the request with its justification,
 * impact, signatures and the evidence that requalified it.
 */
export async function referenceParameterHistory(input: { recipeId: string; key: string }) {
  const db = getDb();
  const [head] = await db
    .select({ recipe: recipes, system: cleaningSystems })
    .from(recipes)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(eq(recipes.id, input.recipeId));
  if (!head) return undefined;
  const versions = await db
    .select({ v: recipeVersions, author: users.name })
    .from(recipeVersions)
    .leftJoin(users, eq(users.id, recipeVersions.createdBy))
    .where(eq(recipeVersions.recipeId, input.recipeId))
    .orderBy(asc(recipeVersions.version));
  const ids = versions.map((v) => v.v.id);
  const params = ids.length
    ? await db
        .select({ p: recipeParameters, stage: recipeStages.name })
        .from(recipeParameters)
        .innerJoin(recipeStages, eq(recipeStages.id, recipeParameters.stageId))
        .where(inArray(recipeParameters.versionId, ids))
    : [];
  const mine = params.filter((r) => r.p.key === input.key);
  if (mine.length === 0) return undefined;

  const values: VersionValue[] = versions.map(({ v }) => {
    const row = mine.find((r) => r.p.versionId === v.id);
    return {
      versionId: v.id,
      version: v.version,
      status: v.status,
      effectiveFrom: v.effectiveFrom,
      effectiveTo: v.effectiveTo,
      value: row
        ? {
            name: row.p.name,
            stage: row.stage,
            setpoint: row.p.setpoint,
            unit: row.p.unit,
            validatedLow: row.p.validatedLow,
            validatedHigh: row.p.validatedHigh,
            critical: row.p.critical,
          }
        : null,
    };
  });
  const changes = await db
    .select()
    .from(changeRequests)
    .where(eq(changeRequests.recipeId, input.recipeId));
  const proposedFrom = new Map(
    changes.filter((c) => c.toVersionId).map((c) => [c.toVersionId!, c.fromVersionId]),
  );
  const timeline = buildParameterTimeline(values, proposedFrom);

  const entries = await Promise.all(
    timeline.map(async (period) => {
      const cr = changes.find((c) => c.toVersionId === period.introducedBy.versionId);
      const version = versions.find((v) => v.v.id === period.introducedBy.versionId)!;
      if (!cr)
        return {
          period,
          versionNote: version.v.notes,
          versionAuthor: version.author,
          versionCreatedAt: version.v.createdAt,
          validations: (await versionValidations(db, [version.v.id])).get(version.v.id) ?? [],
          change: null,
        };
      const state = await loadChangeState(db, cr.id);
      const row = state.assessment.diff.parameters.find((p) => p.key === input.key) ?? null;
      const [sigs, evidence] = await Promise.all([
        changeSignatures(db, cr.id),
        changeEvidence(db, cr.id),
      ]);
      return {
        period,
        versionNote: version.v.notes,
        versionAuthor: version.author,
        versionCreatedAt: version.v.createdAt,
        change: {
          id: cr.id,
          number: cr.number,
          title: cr.title,
          status: cr.status,
          emergency: (await loadEmergencies(db, [cr.id])).has(cr.id) && showsEmergency(cr.status),
          impact: state.impact,
          author: version.author,
          openedAt: cr.createdAt,
          closedAt: cr.closedAt,
          justification: excerpt(narrativeText(state.narrative?.content ?? null)),
          parameterImpact: row
            ? { impact: row.impact, position: row.position, reasons: row.reasons }
            : null,
          requirements: state.requirements.map((r) => ({
            testType: r.testType,
            samples: r.samples,
          })),
          // A signature binds only while the content still hashes to what was signed; reopening starts a new revision.
          signatures: sigs.map((sig) => ({
            ...sig,
            binding:
              sig.revision !== state.assessmentRow.revision
                ? ("earlier_revision" as const)
                : signatureValidity(sig.contentHash, state.contentHash),
          })),
          revision: state.assessmentRow.revision,
          evidence,
        },
      };
    }),
  );
  const latest = mine.sort(
    (a, b) =>
      (versions.find((v) => v.v.id === b.p.versionId)?.v.version ?? 0) -
      (versions.find((v) => v.v.id === a.p.versionId)?.v.version ?? 0),
  )[0];
  return {
    system: head.system,
    recipe: head.recipe,
    parameter: {
      key: input.key,
      name: latest.p.name,
      stage: latest.stage,
      unit: latest.p.unit,
      critical: latest.p.critical,
    },
    entries,
  };
}

// ── The single-record loaders as they were before batching ──

async function loadRecipeSnapshot(db: Executor, versionId: string): Promise<RecipeSnapshot> {
  const [version] = await db.select().from(recipeVersions).where(eq(recipeVersions.id, versionId));
  const stages = await db
    .select()
    .from(recipeStages)
    .where(eq(recipeStages.versionId, versionId))
    .orderBy(asc(recipeStages.position));
  const params = await db
    .select()
    .from(recipeParameters)
    .where(eq(recipeParameters.versionId, versionId))
    .orderBy(sql`rowid`);
  return {
    detergent: version?.detergent ?? null,
    notes: version?.notes ?? null,
    stages: stages.map((s) => ({
      name: s.name,
      kind: s.kind,
      mode: s.mode,
      parameters: params
        .filter((p) => p.stageId === s.id)
        .map((p) => ({
          key: p.key,
          name: p.name,
          kind: p.kind,
          setpoint: p.setpoint,
          unit: p.unit,
          validatedLow: p.validatedLow,
          validatedHigh: p.validatedHigh,
          critical: p.critical,
        })),
    })),
  };
}

async function loadNarrative(db: Executor, documentId: string | null) {
  if (!documentId) return null;
  const [v] = await db
    .select()
    .from(documentVersions)
    .where(eq(documentVersions.documentId, documentId))
    .orderBy(asc(documentVersions.version));
  return v ?? null;
}

async function getEffectiveMatrix(db: Executor) {
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
    })),
  };
}

/**
 * Everything one change request is: the proposal against the effective version,
 * the assessment (live while a draft, frozen once submitted), the narrative and
 * the hash its signatures bind to. Pages and services read it the same way, so the
 * hash shown in the signing dialog is the hash the server checks.
 */
async function loadChangeState(db: Executor, changeRequestId: string) {
  const [row] = await db
    .select({ cr: changeRequests, a: changeRequestAssessments, recipe: recipes })
    .from(changeRequests)
    .innerJoin(
      changeRequestAssessments,
      eq(changeRequestAssessments.changeRequestId, changeRequests.id),
    )
    .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
    .where(eq(changeRequests.id, changeRequestId));
  if (!row) throw new UserFacingError("That change request does not exist.", { kind: "not_found" });
  const { cr, a, recipe } = row;
  if (!cr.fromVersionId || !cr.toVersionId)
    throw new UserFacingError("This change request has no recipe versions to compare.");
  const [fromVersion] = await db
    .select()
    .from(recipeVersions)
    .where(eq(recipeVersions.id, cr.fromVersionId));
  const [toVersion] = await db
    .select()
    .from(recipeVersions)
    .where(eq(recipeVersions.id, cr.toVersionId));
  const [from, to] = await Promise.all([
    loadRecipeSnapshot(db, cr.fromVersionId),
    loadRecipeSnapshot(db, cr.toVersionId),
  ]);
  const family = a.partFamilyId
    ? (await db.select().from(partFamilies).where(eq(partFamilies.id, a.partFamilyId)))[0]
    : undefined;
  const newPartFamily =
    a.kind === "new_part_family" && family ? `${family.code} ${family.name}` : null;

  const matrix = cr.status === "draft" ? await getEffectiveMatrix(db) : null;
  const assessment = assess({
    from,
    to,
    newPartFamily,
    raisedTo: a.raisedTo,
    matrix: matrix?.rows ?? [],
  });
  // Once submitted, the required tests are the ones frozen at submission, not a re-reading of a later matrix.
  const stored =
    cr.status === "draft"
      ? []
      : await db
          .select()
          .from(changeRequestTests)
          .where(eq(changeRequestTests.changeRequestId, cr.id))
          .orderBy(asc(changeRequestTests.testType));
  const requirements =
    cr.status === "draft"
      ? assessment.tests.map((t) => ({
          testType: t.testType,
          samples: t.samples,
          confidencePct: t.confidencePct,
          reliabilityPct: t.reliabilityPct,
          because: t.because,
        }))
      : stored.map((t) => ({
          testType: t.testType as TestType,
          samples: t.samples,
          confidencePct: t.confidencePct,
          reliabilityPct: t.reliabilityPct,
          because: t.because,
        }));
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
/** Every signature on a change request, over all its revisions, oldest first. */
async function changeSignatures(db: Executor, changeRequestId: string) {
  const rows = await db
    .select()
    .from(signatures)
    // "<id>#" up to "<id>$" ("$" follows "#") is every revision, as a range the record index can seek.
    .where(
      and(
        eq(signatures.recordType, "change_request"),
        gte(signatures.recordId, `${changeRequestId}#`),
        lt(signatures.recordId, `${changeRequestId}$`),
      ),
    )
    .orderBy(asc(signatures.signedAt));
  return rows.map((s) => ({ ...s, revision: Number(s.recordId.split("#")[1] ?? 1) }));
}

/**
 * The test runs offered as evidence for a change request (tied to it, or linked to
 * one of its required tests), each with its sample count, signatures and files.
 */
async function changeEvidence(db: Executor, changeRequestId: string) {
  const reqs = await db
    .select({ id: changeRequestTests.id })
    .from(changeRequestTests)
    .where(eq(changeRequestTests.changeRequestId, changeRequestId));
  const linked = reqs.length
    ? await db
        .select({ runId: changeRequestEvidence.testRunId })
        .from(changeRequestEvidence)
        .where(
          inArray(
            changeRequestEvidence.requirementId,
            reqs.map((r) => r.id),
          ),
        )
    : [];
  const runs = await db
    .select()
    .from(testRuns)
    .where(
      linked.length
        ? or(
            eq(testRuns.changeRequestId, changeRequestId),
            inArray(
              testRuns.id,
              linked.map((l) => l.runId),
            ),
          )
        : eq(testRuns.changeRequestId, changeRequestId),
    )
    .orderBy(asc(testRuns.number), asc(testRuns.revision));
  const ids = runs.map((r) => r.id);
  if (ids.length === 0) return [];
  const [results, sigs, files] = await Promise.all([
    db
      .select({ runId: testSamples.runId, worstCase: testSamples.worstCase })
      .from(testSamples)
      .where(inArray(testSamples.runId, ids)),
    db
      .select()
      .from(signatures)
      .where(and(eq(signatures.recordType, "test_run"), inArray(signatures.recordId, ids)))
      .orderBy(asc(signatures.signedAt)),
    db
      .select()
      .from(evidenceFiles)
      .where(inArray(evidenceFiles.runId, ids))
      .orderBy(asc(evidenceFiles.uploadedAt)),
  ]);
  return runs.map((run) => ({
    ...run,
    samples: results.filter((r) => r.runId === run.id).length,
    worstCaseSamples: results.filter((r) => r.runId === run.id && r.worstCase).length,
    signatures: sigs.filter((s) => s.recordId === run.id),
    files: files.filter((f) => f.runId === run.id),
  }));
}
