import "server-only";
import { getLabDetails } from "@/lib/server/lab-report/lab-details";
import { and, asc, desc, eq, gt, inArray, lt, or, type AnyColumn, type SQL } from "drizzle-orm";
import type { z } from "zod";
import { getDb } from "@/db/client";
import {
  auditEvents,
  changeRequests,
  cleaningSystems,
  cleanlinessSpecs,
  evidenceFiles,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  signatures,
  sites,
  systemStages,
  testSamples,
  testRuns,
} from "@/db/schema";
import { currentEventType } from "@/lib/audit/read";
import { BadCursorError, decodeCursor, encodeCursor } from "@/lib/api/cursor";
import { narrativeText } from "@/lib/changes/content";
import { requalificationDue } from "@/lib/changes/periodic";
import { formatDate } from "@/lib/format/date";
import type {
  auditEventsQuery,
  AuditEventOut,
  ChangeRequestDetailOut,
  ChangeRequestOut,
  changeRequestsQuery,
  CleaningSystemOut,
  pageQuery,
  partFamiliesQuery,
  PartFamilyOut,
  qualifiedCombinationsQuery,
  QualifiedCombinationOut,
  RecipeOut,
  recipesQuery,
  RecipeVersionOut,
  specificationsQuery,
  SpecificationOut,
  TestRunDetailOut,
  TestRunOut,
  testRunsQuery,
} from "@/lib/schemas/api";
import { auditConditions } from "@/lib/server/audit/query-audit-events";
import { loadRecipeSnapshot } from "@/lib/server/changes/snapshot";
import { loadChangeState } from "@/lib/server/changes/state";
import { changeEvidence, changeSignatures } from "@/lib/server/trace/evidence-of-change";

/** Rows after the cursor in (key, id) order. */
export function after(key: AnyColumn, id: AnyColumn, cursor: string | undefined): SQL | undefined {
  if (!cursor) return undefined;
  const c = decodeCursor(cursor);
  if (!c) throw new BadCursorError();
  return or(gt(key, c.key), and(eq(key, c.key), gt(id, c.id)));
}

export function page<T>(rows: T[], limit: number, cursorOf: (row: T) => [string, string]) {
  const data = rows.slice(0, limit);
  const last = data.at(-1);
  return { data, nextCursor: rows.length > limit && last ? encodeCursor(...cursorOf(last)) : null };
}

export async function listSystemsApi(q: z.output<typeof pageQuery>) {
  const db = getDb();
  const rows = await db
    .select({ s: cleaningSystems, site: sites.name })
    .from(cleaningSystems)
    .innerJoin(sites, eq(sites.id, cleaningSystems.siteId))
    .where(after(cleaningSystems.code, cleaningSystems.id, q.cursor))
    .orderBy(asc(cleaningSystems.code), asc(cleaningSystems.id))
    .limit(q.limit + 1);
  const stages = rows.length
    ? await db
        .select()
        .from(systemStages)
        .where(
          inArray(
            systemStages.systemId,
            rows.map((r) => r.s.id),
          ),
        )
        .orderBy(asc(systemStages.position))
    : [];
  const out = page(rows, q.limit, (r) => [r.s.code, r.s.id]);
  return {
    nextCursor: out.nextCursor,
    data: out.data.map(({ s, site }): CleaningSystemOut => ({
      id: s.id,
      code: s.code,
      name: s.name,
      kind: s.kind,
      assetNumber: s.assetNumber,
      description: s.description,
      active: s.active,
      retiredAt: s.retiredAt,
      retireReason: s.retireReason,
      site,
      stages: stages
        .filter((st) => st.systemId === s.id)
        .map((st) => ({
          position: st.position,
          name: st.name,
          kind: st.kind,
          capabilities: st.capabilities as CleaningSystemOut["stages"][number]["capabilities"],
          tankVolumeL: st.tankVolumeL,
          filterRatingUm: st.filterRatingUm,
          ultrasonicPowerW: st.ultrasonicPowerW,
          ultrasonicFrequencyKHz: st.ultrasonicFrequencyKHz,
          sprayPressureBar: st.sprayPressureBar,
          injectionPressureBar: st.injectionPressureBar,
          nozzleSet: st.nozzleSet,
        })),
    })),
  };
}

async function recipeRows(where: SQL | undefined, limit: number) {
  const db = getDb();
  const rows = await db
    .select({
      r: recipes,
      systemCode: cleaningSystems.code,
      systemAssetNumber: cleaningSystems.assetNumber,
      systemActive: cleaningSystems.active,
    })
    .from(recipes)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(where)
    .orderBy(asc(recipes.code), asc(recipes.id))
    .limit(limit);
  const versions = rows.length
    ? await db
        .select()
        .from(recipeVersions)
        .where(
          inArray(
            recipeVersions.recipeId,
            rows.map((r) => r.r.id),
          ),
        )
        .orderBy(asc(recipeVersions.version))
    : [];
  return rows.map(({ r, systemCode, systemAssetNumber, systemActive }) => ({
    row: r,
    out: {
      id: r.id,
      code: r.code,
      name: r.name,
      description: r.description,
      systemId: r.systemId,
      systemCode,
      systemAssetNumber,
      systemRetired: !systemActive,
      versions: versions
        .filter((v) => v.recipeId === r.id)
        .map((v) => ({
          id: v.id,
          version: v.version,
          status: v.status,
          effectiveFrom: v.effectiveFrom,
          effectiveTo: v.effectiveTo,
        })),
    } satisfies RecipeOut,
  }));
}

export async function listRecipesApi(q: z.output<typeof recipesQuery>) {
  const rows = await recipeRows(
    and(
      q.systemId ? eq(recipes.systemId, q.systemId) : undefined,
      after(recipes.code, recipes.id, q.cursor),
    ),
    q.limit + 1,
  );
  const out = page(rows, q.limit, (r) => [r.row.code, r.row.id]);
  return { data: out.data.map((r) => r.out), nextCursor: out.nextCursor };
}

export async function getRecipeApi(recipeId: string) {
  const [r] = await recipeRows(eq(recipes.id, recipeId), 1);
  return r?.out;
}

export async function getRecipeVersionApi(
  recipeId: string,
  version: number,
): Promise<RecipeVersionOut | undefined> {
  const db = getDb();
  const [row] = await db
    .select({ v: recipeVersions, code: recipes.code })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(recipeVersions.recipeId, recipeId), eq(recipeVersions.version, version)));
  if (!row) return undefined;
  const snapshot = await loadRecipeSnapshot(db, row.v.id);
  return {
    id: row.v.id,
    version: row.v.version,
    status: row.v.status,
    effectiveFrom: row.v.effectiveFrom,
    effectiveTo: row.v.effectiveTo,
    recipeId,
    recipeCode: row.code,
    detergent: snapshot.detergent,
    notes: snapshot.notes,
    stages: snapshot.stages.map((s, i) => ({
      position: i + 1,
      name: s.name,
      kind: s.kind,
      mode: s.mode,
      parameters: s.parameters,
    })),
  };
}

export async function listPartFamiliesApi(q: z.output<typeof partFamiliesQuery>) {
  const rows = await getDb()
    .select({
      f: partFamilies,
      specCode: cleanlinessSpecs.code,
      specRevision: cleanlinessSpecs.revision,
    })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(
      and(
        q.specCode ? eq(cleanlinessSpecs.code, q.specCode) : undefined,
        after(partFamilies.code, partFamilies.id, q.cursor),
      ),
    )
    .orderBy(asc(partFamilies.code), asc(partFamilies.id))
    .limit(q.limit + 1);
  const out = page(rows, q.limit, (r) => [r.f.code, r.f.id]);
  return {
    nextCursor: out.nextCursor,
    data: out.data.map(({ f, specCode, specRevision }): PartFamilyOut => ({
      id: f.id,
      code: f.code,
      name: f.name,
      partNumbers: f.partNumbers,
      material: f.material,
      wettedAreaCm2: f.wettedAreaCm2,
      wettedAreaMethod: f.wettedAreaMethod,
      wettedAreaNote: f.wettedAreaNote,
      drawingNumber: f.drawingNumber,
      drawingRevision: f.drawingRevision,
      customer: f.customer,
      description: f.description,
      specId: f.specId,
      specCode,
      specRevision,
    })),
  };
}

/** Specification revisions, each its own record, ordered by their ids (stable across a new revision of another code). */
export async function listSpecificationsApi(q: z.output<typeof specificationsQuery>) {
  const rows = await getDb()
    .select({ s: cleanlinessSpecs, sha256: evidenceFiles.sha256 })
    .from(cleanlinessSpecs)
    .leftJoin(evidenceFiles, eq(evidenceFiles.id, cleanlinessSpecs.sourceFileId))
    .where(
      and(
        q.status ? eq(cleanlinessSpecs.status, q.status) : undefined,
        after(cleanlinessSpecs.code, cleanlinessSpecs.id, q.cursor),
      ),
    )
    .orderBy(asc(cleanlinessSpecs.code), asc(cleanlinessSpecs.id))
    .limit(q.limit + 1);
  const out = page(rows, q.limit, (r) => [r.s.code, r.s.id]);
  return {
    nextCursor: out.nextCursor,
    data: out.data.map(({ s, sha256 }): SpecificationOut => ({
      id: s.id,
      code: s.code,
      name: s.name,
      customer: s.customer,
      documentNumber: s.documentNumber,
      revision: s.revision,
      status: s.status,
      supersedesId: s.supersedesId,
      supersededAt: s.supersededAt,
      ccc: s.ccc,
      maxMetallicUm: s.maxMetallicUm,
      maxNonMetallicUm: s.maxNonMetallicUm,
      maxFibreUm: s.maxFibreUm,
      gravimetricLimitMg: s.gravimetricLimitMg,
      gravimetricBasis: s.gravimetricBasis,
      minWettingTensionMNm: s.minWettingTensionMNm,
      visualCriteria: s.visualCriteria,
      drynessCriteria: s.drynessCriteria,
      extraRequirements: s.extraRequirements,
      customerApprovesChanges: s.customerApprovesChanges,
      sourceFileSha256: sha256 ?? null,
      createdAt: s.createdAt,
    })),
  };
}

export async function listQualifiedCombinationsApi(q: z.output<typeof qualifiedCombinationsQuery>) {
  const rows = await getDb()
    .select({
      i: requalificationIntervals,
      familyCode: partFamilies.code,
      v: recipeVersions,
      recipeCode: recipes.code,
    })
    .from(requalificationIntervals)
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(
      and(
        q.partFamilyId ? eq(requalificationIntervals.partFamilyId, q.partFamilyId) : undefined,
        q.recipeId ? eq(recipeVersions.recipeId, q.recipeId) : undefined,
        after(requalificationIntervals.id, requalificationIntervals.id, q.cursor),
      ),
    )
    .orderBy(asc(requalificationIntervals.id))
    .limit(q.limit + 1);
  const out = page(rows, q.limit, (r) => [r.i.id, r.i.id]);
  return {
    nextCursor: out.nextCursor,
    data: out.data.map(({ i, familyCode, v, recipeCode }): QualifiedCombinationOut => ({
      id: i.id,
      partFamilyId: i.partFamilyId,
      partFamilyCode: familyCode,
      recipeId: v.recipeId,
      recipeCode,
      recipeVersionId: v.id,
      recipeVersion: v.version,
      recipeVersionStatus: v.status,
      lastQualifiedAt: i.lastQualifiedAt,
      intervalMonths: i.intervalMonths,
      dueOn: formatDate(requalificationDue(i.lastQualifiedAt, i.intervalMonths)),
      basis: i.basis,
    })),
  };
}

async function changeRows(where: SQL | undefined, limit: number) {
  const db = getDb();
  const rows = await db
    .select({ c: changeRequests, recipeCode: recipes.code })
    .from(changeRequests)
    .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
    .where(where)
    .orderBy(asc(changeRequests.number), asc(changeRequests.id))
    .limit(limit);
  const versionIds = rows
    .flatMap((r) => [r.c.fromVersionId, r.c.toVersionId])
    .filter((x): x is string => !!x);
  const versions = versionIds.length
    ? await db
        .select({ id: recipeVersions.id, version: recipeVersions.version })
        .from(recipeVersions)
        .where(inArray(recipeVersions.id, versionIds))
    : [];
  const num = (id: string | null) => versions.find((v) => v.id === id)?.version ?? null;
  return rows.map(({ c, recipeCode }) => ({
    row: c,
    out: {
      id: c.id,
      number: c.number,
      title: c.title,
      status: c.status,
      impact: c.impact,
      recipeId: c.recipeId,
      recipeCode,
      fromVersion: num(c.fromVersionId),
      toVersion: num(c.toVersionId),
      createdAt: c.createdAt,
      closedAt: c.closedAt,
    } satisfies ChangeRequestOut,
  }));
}

export async function listChangeRequestsApi(q: z.output<typeof changeRequestsQuery>) {
  const where = and(
    q.status ? eq(changeRequests.status, q.status) : undefined,
    q.recipeId ? eq(changeRequests.recipeId, q.recipeId) : undefined,
    after(changeRequests.number, changeRequests.id, q.cursor),
  );
  const out = page(await changeRows(where, q.limit + 1), q.limit, (r) => [r.row.number, r.row.id]);
  return { data: out.data.map((r) => r.out), nextCursor: out.nextCursor };
}

export async function getChangeRequestApi(
  changeRequestId: string,
): Promise<ChangeRequestDetailOut | undefined> {
  const [head] = await changeRows(eq(changeRequests.id, changeRequestId), 1);
  if (!head) return undefined;
  const db = getDb();
  const state = await loadChangeState(db, changeRequestId);
  const [sigs, evidence] = await Promise.all([
    changeSignatures(db, changeRequestId),
    changeEvidence(db, changeRequestId),
  ]);
  return {
    ...head.out,
    impact: head.out.impact ?? state.impact,
    justification: narrativeText(state.narrative?.content ?? null),
    parameterChanges: state.assessment.diff.parameters
      .filter((p) => p.change !== "unchanged")
      .map((p) => ({
        key: p.key,
        name: p.name,
        stage: p.stage,
        change: p.change,
        old: p.old,
        new: p.new,
        position: p.position,
        impact: p.impact,
        reasons: p.reasons,
      })),
    requiredTests: state.requirements.map((r) => ({
      testType: r.testType,
      samples: r.samples,
      confidencePct: r.confidencePct,
      reliabilityPct: r.reliabilityPct,
    })),
    signatures: sigs.map((s) => ({
      printedName: s.printedName,
      meaning: s.meaning,
      signedAt: s.signedAt,
      contentHash: s.contentHash,
      revision: s.revision,
    })),
    evidenceRunIds: evidence.map((r) => r.id),
  };
}

async function runRows(where: SQL | undefined, limit: number) {
  const rows = await getDb()
    .select({ r: testRuns, familyCode: partFamilies.code })
    .from(testRuns)
    .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
    .where(where)
    .orderBy(asc(testRuns.createdAt), asc(testRuns.id))
    .limit(limit);
  return rows.map(({ r, familyCode }) => ({
    row: r,
    out: {
      id: r.id,
      number: r.number,
      revision: r.revision,
      testType: r.testType,
      status: r.status,
      outcome: r.outcome,
      partFamilyId: r.partFamilyId,
      partFamilyCode: familyCode,
      recipeVersionId: r.recipeVersionId,
      changeRequestId: r.changeRequestId,
      lab: r.lab,
      performedOn: r.performedOn,
      createdAt: r.createdAt,
    } satisfies TestRunOut,
  }));
}

export async function listTestRunsApi(q: z.output<typeof testRunsQuery>) {
  const where = and(
    q.changeRequestId ? eq(testRuns.changeRequestId, q.changeRequestId) : undefined,
    q.recipeVersionId ? eq(testRuns.recipeVersionId, q.recipeVersionId) : undefined,
    q.partFamilyId ? eq(testRuns.partFamilyId, q.partFamilyId) : undefined,
    q.testType ? eq(testRuns.testType, q.testType) : undefined,
    after(testRuns.createdAt, testRuns.id, q.cursor),
  );
  const out = page(await runRows(where, q.limit + 1), q.limit, (r) => [r.row.createdAt, r.row.id]);
  return { data: out.data.map((r) => r.out), nextCursor: out.nextCursor };
}

export async function getTestRunApi(runId: string): Promise<TestRunDetailOut | undefined> {
  const [head] = await runRows(eq(testRuns.id, runId), 1);
  if (!head) return undefined;
  const db = getDb();
  const [samples, files, sigs, [stored]] = await Promise.all([
    db
      .select()
      .from(testSamples)
      .where(eq(testSamples.runId, runId))
      .orderBy(asc(testSamples.createdAt), asc(testSamples.sampleLabel)),
    db
      .select()
      .from(evidenceFiles)
      .where(eq(evidenceFiles.runId, runId))
      .orderBy(asc(evidenceFiles.uploadedAt)),
    db
      .select()
      .from(signatures)
      .where(and(eq(signatures.recordType, "test_run"), eq(signatures.recordId, runId)))
      .orderBy(asc(signatures.signedAt)),
    db.select({ runData: testRuns.runData }).from(testRuns).where(eq(testRuns.id, runId)),
  ]);
  return {
    ...head.out,
    runData: stored?.runData ?? null,
    samples: samples.map((r) => ({
      id: r.id,
      sampleLabel: r.sampleLabel,
      cycleNumber: r.cycleNumber,
      basketPosition: r.basketPosition,
      worstCase: r.worstCase,
      data: r.data as Record<string, unknown>,
    })),
    files: files.map((f) => ({
      id: f.id,
      originalName: f.originalName,
      mimeType: f.mimeType,
      sizeBytes: f.sizeBytes,
      sha256: f.sha256,
    })),
    signatures: sigs.map((s) => ({
      printedName: s.printedName,
      meaning: s.meaning,
      signedAt: s.signedAt,
      contentHash: s.contentHash,
    })),
    labDetails: await getLabDetails(db, runId),
  };
}

/** Newest first, like the audit-trail browser; the cursor is the last sequence number seen. */
export async function listAuditEventsApi(q: z.output<typeof auditEventsQuery>) {
  let before: number | undefined;
  if (q.cursor) {
    const c = decodeCursor(q.cursor);
    if (!c || !/^\d+$/.test(c.key)) throw new BadCursorError();
    before = Number(c.key);
  }
  const filters = auditConditions(q);
  const rows = await getDb()
    .select()
    .from(auditEvents)
    .where(before ? and(filters, lt(auditEvents.seq, before)) : filters)
    .orderBy(desc(auditEvents.seq))
    .limit(q.limit + 1);
  const data = rows.slice(0, q.limit).map((r): AuditEventOut => ({
    seq: r.seq,
    at: r.at,
    actorName: r.actorName,
    eventType: currentEventType(r.action),
    storedEventType: r.action,
    recordType: r.recordType,
    recordId: r.recordId,
    old: r.oldValue ? JSON.parse(r.oldValue) : null,
    new: r.newValue ? JSON.parse(r.newValue) : null,
    reason: r.reason,
    prevHash: r.prevHash,
    hash: r.hash,
  }));
  return {
    data,
    nextCursor: rows.length > q.limit ? encodeCursor(String(data.at(-1)!.seq), "") : null,
  };
}
