import "server-only";
import {
  and,
  asc,
  count,
  desc,
  eq,
  gte,
  inArray,
  isNull,
  lte,
  ne,
  or,
  sql,
  type SQL,
} from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequestEvidence,
  changeRequests,
  changeRequestTests,
  cleanlinessSpecs,
  documents,
  evidenceFiles,
  partFamilies,
  recipes,
  recipeVersions,
  testSamples,
  testRuns,
  userRoles,
  users,
} from "@/db/schema";
import type { EvidenceListPage, EvidenceListQuery } from "@/lib/schemas/evidence-list";
import { listSignatures } from "@/lib/server/signatures/queries";
import { computeStoredOutcome } from "./refresh-outcome";
import { runContent } from "./run-content";

const tech = alias(users, "technician");

/** One page of runs for the evidence table: filtered, sorted and paged in SQL. */
export async function listRunsPage(q: EvidenceListQuery): Promise<EvidenceListPage> {
  const db = getDb();
  const where: SQL[] = [];
  if (!q.includeSuperseded) where.push(ne(testRuns.status, "superseded"));
  if (q.partFamilyId) where.push(eq(testRuns.partFamilyId, q.partFamilyId));
  if (q.recipeVersionId) where.push(eq(testRuns.recipeVersionId, q.recipeVersionId));
  if (q.recipeId)
    where.push(
      inArray(
        testRuns.recipeVersionId,
        db
          .select({ id: recipeVersions.id })
          .from(recipeVersions)
          .where(
            and(
              eq(recipeVersions.recipeId, q.recipeId),
              q.version === undefined ? undefined : eq(recipeVersions.version, q.version),
            ),
          ),
      ),
    );
  if (q.testType) where.push(eq(testRuns.testType, q.testType));
  if (q.outcome) where.push(eq(testRuns.outcome, q.outcome));
  if (q.from) where.push(gte(testRuns.performedOn, q.from));
  if (q.to) where.push(lte(testRuns.performedOn, q.to));
  const filter = where.length ? and(...where) : undefined;
  const sortColumn = {
    number: testRuns.number,
    performedOn: testRuns.performedOn,
    partFamily: partFamilies.code,
    testType: testRuns.testType,
    outcome: testRuns.outcome,
    status: testRuns.status,
  }[q.sort];
  const order = q.dir === "asc" ? asc(sortColumn) : desc(sortColumn);
  // Every run has its part family (a foreign key), so the count needs no join.
  const [{ total }] = await db.select({ total: count() }).from(testRuns).where(filter);
  const rows = await db
    .select({
      id: testRuns.id,
      number: testRuns.number,
      revision: testRuns.revision,
      partFamily: partFamilies.code,
      recipeCode: recipes.code,
      recipeVersion: recipeVersions.version,
      testType: testRuns.testType,
      status: testRuns.status,
      outcome: testRuns.outcome,
      performedOn: testRuns.performedOn,
      technician: tech.name,
      lab: testRuns.lab,
    })
    .from(testRuns)
    .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, testRuns.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .leftJoin(tech, eq(tech.id, testRuns.technicianId))
    .where(filter)
    .orderBy(order, desc(testRuns.number), desc(testRuns.revision))
    .limit(q.pageSize)
    .offset((q.page - 1) * q.pageSize);
  return {
    rows: rows.map(({ recipeCode, recipeVersion, ...r }) => ({
      ...r,
      recipe: `${recipeCode} v${recipeVersion}`,
    })),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}

/** Recipe versions a new run is usually for: in force, proposed by a change, or a first draft being validated. */
export const CURRENT_VERSION_STATUSES = ["effective", "proposed", "draft"] as const;

/**
 * Part families and recipe versions, by code and newest version first: the run form's and the
 * list's choices. `versions: "current"` leaves out superseded and withdrawn versions: a plant's
 * recipes have thousands of them, and a new run is rarely for one.
 */
function familyAndVersionChoices(
  db: ReturnType<typeof getDb>,
  versions: "all" | "current" = "all",
) {
  return Promise.all([
    partFamilyChoices(),
    db
      .select({
        id: recipeVersions.id,
        version: recipeVersions.version,
        status: recipeVersions.status,
        code: recipes.code,
        name: recipes.name,
      })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(
        versions === "current"
          ? inArray(recipeVersions.status, CURRENT_VERSION_STATUSES)
          : undefined,
      )
      .orderBy(asc(recipes.code), desc(recipeVersions.version)),
  ]);
}

const versionLabel = (v: { code: string; version: number; status: string }) =>
  `${v.code} v${v.version} (${v.status})`;

/**
 * The evidence list's filter choices, as the selects print them (no names: they are sent to the
 * browser). Recipes, not their versions: a plant's recipes have thousands of versions between
 * them, so the list takes a recipe and a version number.
 */
export async function evidenceFilterOptions() {
  const db = getDb();
  const [families, recipeRows] = await Promise.all([
    db
      .select({ id: partFamilies.id, code: partFamilies.code })
      .from(partFamilies)
      .orderBy(asc(partFamilies.code)),
    db.select({ id: recipes.id, code: recipes.code }).from(recipes).orderBy(asc(recipes.code)),
  ]);
  return { families, recipes: recipeRows };
}

/**
 * Choices for the run form: the current recipe versions unless `versions` is "all" (results that
 * arrive for a superseded version). Protocols are offered once the part family and version are
 * chosen (protocolsFor): a plant has thousands.
 */
export async function runFormOptions(versions: "all" | "current" = "current") {
  const db = getDb();
  const [[families, versionRows], technicians, changes] = await Promise.all([
    familyAndVersionChoices(db, versions),
    db
      .select({ id: users.id, name: users.name })
      .from(users)
      .innerJoin(userRoles, eq(userRoles.userId, users.id))
      .where(and(eq(userRoles.role, "technician"), eq(users.active, true)))
      .orderBy(asc(users.name)),
    db
      .select({
        id: changeRequests.id,
        number: changeRequests.number,
        title: changeRequests.title,
        toVersionId: changeRequests.toVersionId,
        partFamilyId: changeRequestAssessments.partFamilyId,
      })
      .from(changeRequests)
      .leftJoin(
        changeRequestAssessments,
        eq(changeRequestAssessments.changeRequestId, changeRequests.id),
      )
      .where(inArray(changeRequests.status, ["approved_for_implementation", "requalification"]))
      .orderBy(asc(changeRequests.number)),
  ]);
  return {
    families,
    versions: versionRows.map((v) => ({
      id: v.id,
      label: versionLabel(v),
      name: v.name,
    })),
    technicians,
    changes,
  };
}

/**
 * The IQ, OQ and PQ protocols a run on this part family and recipe version can execute: each
 * link a protocol names (washer, part family, recipe version) must be the run's; a protocol
 * written for the washer alone (an IQ) is offered with every family and version run on it.
 */
export async function protocolsFor(partFamilyId: string, recipeVersionId: string) {
  const systemOfVersion = sql`(select ${recipes.systemId} from ${recipes} where ${recipes.id} = (select ${recipeVersions.recipeId} from ${recipeVersions} where ${recipeVersions.id} = ${recipeVersionId}))`;
  return getDb()
    .select({ id: documents.id, number: documents.number, title: documents.title })
    .from(documents)
    .where(
      and(
        inArray(documents.type, ["iq_protocol", "oq_protocol", "pq_protocol"]),
        or(isNull(documents.systemId), eq(documents.systemId, systemOfVersion)),
        or(isNull(documents.partFamilyId), eq(documents.partFamilyId, partFamilyId)),
        or(isNull(documents.recipeVersionId), eq(documents.recipeVersionId, recipeVersionId)),
      ),
    )
    .orderBy(asc(documents.number));
}

/**
 * The recipe versions a part family has been washed with as far as the records say: a test run of
 * it, a qualified combination (requalification interval) or a control plan. The new-run form lists
 * these first; a first run on a new combination still finds every version below them.
 */
export async function versionsUsedWith(partFamilyId: string): Promise<string[]> {
  const rows = await getDb().all<{ id: string }>(sql`
    select recipe_version_id as id from test_runs where part_family_id = ${partFamilyId}
    union select recipe_version_id from requalification_intervals where part_family_id = ${partFamilyId}
    union select recipe_version_id from control_plans where part_family_id = ${partFamilyId}`);
  return rows.map((r) => r.id);
}

/** A run with everything its page shows: context, raw data, files, signatures, computed outcome, revisions. */
export async function getRunDetail(runId: string) {
  const db = getDb();
  const [row] = await db
    .select({
      run: testRuns,
      family: partFamilies,
      spec: cleanlinessSpecs,
      version: recipeVersions,
      recipe: recipes,
      technician: tech.name,
    })
    .from(testRuns)
    .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
    .innerJoin(
      cleanlinessSpecs,
      eq(cleanlinessSpecs.id, sql`coalesce(${testRuns.specId}, ${partFamilies.specId})`),
    )
    .innerJoin(recipeVersions, eq(recipeVersions.id, testRuns.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .leftJoin(tech, eq(tech.id, testRuns.technicianId))
    .where(eq(testRuns.id, runId));
  if (!row) return undefined;
  const { hash, samples, labDetails } = await runContent(db, row.run);
  const files = await db
    .select({ file: evidenceFiles, uploader: users.name })
    .from(evidenceFiles)
    .innerJoin(users, eq(users.id, evidenceFiles.uploadedBy))
    .where(eq(evidenceFiles.runId, runId))
    .orderBy(asc(evidenceFiles.uploadedAt));
  const [signatures, outcome, revisions, change, protocol] = await Promise.all([
    listSignatures("test_run", runId, hash),
    computeStoredOutcome(db, row.run),
    db
      .select({
        id: testRuns.id,
        revision: testRuns.revision,
        status: testRuns.status,
        outcome: testRuns.outcome,
        revisionReason: testRuns.revisionReason,
        createdAt: testRuns.createdAt,
      })
      .from(testRuns)
      .where(eq(testRuns.number, row.run.number))
      .orderBy(desc(testRuns.revision)),
    // Tied when the run was opened, or linked to a required test later from the change request.
    row.run.changeRequestId
      ? db
          .select()
          .from(changeRequests)
          .where(eq(changeRequests.id, row.run.changeRequestId))
          .then((r) => r[0])
      : db
          .select({ cr: changeRequests })
          .from(changeRequestEvidence)
          .innerJoin(
            changeRequestTests,
            eq(changeRequestTests.id, changeRequestEvidence.requirementId),
          )
          .innerJoin(changeRequests, eq(changeRequests.id, changeRequestTests.changeRequestId))
          .where(eq(changeRequestEvidence.testRunId, runId))
          .then((r) => r[0]?.cr),
    row.run.protocolDocumentId
      ? db
          .select()
          .from(documents)
          .where(eq(documents.id, row.run.protocolDocumentId))
          .then((r) => r[0])
      : undefined,
  ]);
  return {
    ...row,
    contentHash: hash,
    samples,
    labDetails,
    files,
    signatures,
    outcome,
    revisions,
    change,
    protocol,
  };
}
export type RunDetail = NonNullable<Awaited<ReturnType<typeof getRunDetail>>>;

/** Part families by code with their names: the trends page's chooser. */
export function partFamilyChoices() {
  return getDb()
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
}

/**
 * The recipe versions a part family's particle runs were washed with, by code and newest first:
 * the trend's version choices (a plant's recipes have thousands of versions in all).
 */
export async function particleRunVersions(partFamilyId: string) {
  const rows = await getDb()
    .selectDistinct({
      id: recipeVersions.id,
      version: recipeVersions.version,
      status: recipeVersions.status,
      code: recipes.code,
    })
    .from(testRuns)
    .innerJoin(recipeVersions, eq(recipeVersions.id, testRuns.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(
      and(
        eq(testRuns.partFamilyId, partFamilyId),
        eq(testRuns.testType, "particle_cleanliness"),
        ne(testRuns.status, "superseded"),
      ),
    )
    .orderBy(asc(recipes.code), desc(recipeVersions.version));
  return rows.map((v) => ({ id: v.id, label: versionLabel(v) }));
}

/** Particle runs of a part family (optionally one recipe version) with their samples, oldest first, for the trend chart. */
export async function particleHistory(partFamilyId: string, recipeVersionId?: string) {
  const db = getDb();
  const where = [
    eq(testRuns.partFamilyId, partFamilyId),
    eq(testRuns.testType, "particle_cleanliness"),
    ne(testRuns.status, "superseded"),
  ];
  if (recipeVersionId) where.push(eq(testRuns.recipeVersionId, recipeVersionId));
  const runs = await db
    .select()
    .from(testRuns)
    .where(and(...where))
    .orderBy(asc(testRuns.performedOn), asc(testRuns.number));
  const samples = runs.length
    ? await db
        .select()
        .from(testSamples)
        .where(
          inArray(
            testSamples.runId,
            runs.map((r) => r.id),
          ),
        )
    : [];
  const [family] = await db
    .select({ family: partFamilies, spec: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(eq(partFamilies.id, partFamilyId));
  return {
    family,
    runs: runs.map((r) => ({ ...r, samples: samples.filter((s) => s.runId === r.id) })),
  };
}
