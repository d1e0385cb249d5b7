import "server-only";
import { eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  apiTokens,
  bathRecords,
  changeRequests,
  cleaningSystems,
  cleanlinessSpecs,
  documentReviews,
  documents,
  documentVersions,
  evidenceFiles,
  maintenanceIntervals,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  requalificationMatrices,
  signatures,
  sites,
  systemStages,
  testRuns,
  users,
} from "@/db/schema";
import type { RecordLabeller } from "@/lib/audit/describe";
import { humanize } from "@/lib/format/labels";

type Db = ReturnType<typeof getDb>;
type Lookup = (db: Db, ids: string[]) => Promise<[string, string][]>;

const recipeVersionLabels: Lookup = async (db, ids) =>
  (
    await db
      .select({ id: recipeVersions.id, code: recipes.code, version: recipeVersions.version })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(inArray(recipeVersions.id, ids))
  ).map((r) => [r.id, `${r.code} v${r.version}`]);

const documentVersionLabels: Lookup = async (db, ids) =>
  (
    await db
      .select({
        id: documentVersions.id,
        number: documents.number,
        title: documents.title,
        version: documentVersions.version,
      })
      .from(documentVersions)
      .innerJoin(documents, eq(documents.id, documentVersions.documentId))
      .where(inArray(documentVersions.id, ids))
  ).map((r) => [r.id, `${r.number} v${r.version} · ${r.title}`]);

const stageLabels: Lookup = async (db, ids) =>
  (
    await db
      .select({ id: systemStages.id, name: systemStages.name, system: cleaningSystems.code })
      .from(systemStages)
      .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
      .where(inArray(systemStages.id, ids))
  ).map((r) => [r.id, `${r.system} ${r.name}`]);

/** One batched query per record type: how each record is named on its own screen. */
const LOOKUPS: Record<string, Lookup> = {
  test_run: async (db, ids) =>
    (
      await db
        .select({
          id: testRuns.id,
          number: testRuns.number,
          revision: testRuns.revision,
          testType: testRuns.testType,
          family: partFamilies.code,
        })
        .from(testRuns)
        .innerJoin(partFamilies, eq(partFamilies.id, testRuns.partFamilyId))
        .where(inArray(testRuns.id, ids))
    ).map((r) => [
      r.id,
      `${r.number}${r.revision > 1 ? ` rev ${r.revision}` : ""} · ${humanize(r.testType)} on ${r.family}`,
    ]),
  change_request: async (db, ids) =>
    (
      await db
        .select({
          id: changeRequests.id,
          number: changeRequests.number,
          title: changeRequests.title,
        })
        .from(changeRequests)
        .where(inArray(changeRequests.id, ids))
    ).map((r) => [r.id, `${r.number} · ${r.title}`]),
  document: async (db, ids) =>
    (
      await db
        .select({ id: documents.id, number: documents.number, title: documents.title })
        .from(documents)
        .where(inArray(documents.id, ids))
    ).map((r) => [r.id, `${r.number} · ${r.title}`]),
  document_version: documentVersionLabels,
  document_review: async (db, ids) => {
    const rows = await db
      .select({ id: documentReviews.id, versionId: documentReviews.versionId })
      .from(documentReviews)
      .where(inArray(documentReviews.id, ids));
    const versions = new Map(
      rows.length
        ? await documentVersionLabels(db, [...new Set(rows.map((r) => r.versionId))])
        : [],
    );
    return rows.map((r) => [r.id, `Review of ${versions.get(r.versionId) ?? "a document"}`]);
  },
  recipe: async (db, ids) =>
    (
      await db
        .select({ id: recipes.id, code: recipes.code, name: recipes.name })
        .from(recipes)
        .where(inArray(recipes.id, ids))
    ).map((r) => [r.id, `${r.code} · ${r.name}`]),
  recipe_version: recipeVersionLabels,
  part_family: async (db, ids) =>
    (
      await db
        .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
        .from(partFamilies)
        .where(inArray(partFamilies.id, ids))
    ).map((r) => [r.id, `${r.code} · ${r.name}`]),
  cleanliness_spec: async (db, ids) =>
    (
      await db
        .select({
          id: cleanlinessSpecs.id,
          code: cleanlinessSpecs.code,
          revision: cleanlinessSpecs.revision,
        })
        .from(cleanlinessSpecs)
        .where(inArray(cleanlinessSpecs.id, ids))
    ).map((r) => [r.id, `${r.code} rev ${r.revision}`]),
  cleaning_system: async (db, ids) =>
    (
      await db
        .select({ id: cleaningSystems.id, code: cleaningSystems.code, name: cleaningSystems.name })
        .from(cleaningSystems)
        .where(inArray(cleaningSystems.id, ids))
    ).map((r) => [r.id, `${r.code} · ${r.name}`]),
  system_stage: stageLabels,
  user: async (db, ids) =>
    (
      await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids))
    ).map((r) => [r.id, r.name]),
  api_token: async (db, ids) =>
    (
      await db
        .select({ id: apiTokens.id, name: apiTokens.name })
        .from(apiTokens)
        .where(inArray(apiTokens.id, ids))
    ).map((r) => [r.id, `API token "${r.name}"`]),
  site: async (db, ids) =>
    (
      await db.select({ id: sites.id, name: sites.name }).from(sites).where(inArray(sites.id, ids))
    ).map((r) => [r.id, r.name]),
  evidence_file: async (db, ids) =>
    (
      await db
        .select({
          id: evidenceFiles.id,
          name: evidenceFiles.originalName,
          run: testRuns.number,
        })
        .from(evidenceFiles)
        .leftJoin(testRuns, eq(testRuns.id, evidenceFiles.runId))
        .where(inArray(evidenceFiles.id, ids))
    ).map((r) => [r.id, r.run ? `${r.name} on ${r.run}` : r.name]),
  signature: async (db, ids) =>
    (
      await db
        .select({
          id: signatures.id,
          meaning: signatures.meaning,
          printedName: signatures.printedName,
        })
        .from(signatures)
        .where(inArray(signatures.id, ids))
    ).map((r) => [r.id, `${humanize(r.meaning)} signature of ${r.printedName}`]),
  requalification_interval: async (db, ids) => {
    const rows = await db
      .select({
        id: requalificationIntervals.id,
        family: partFamilies.code,
        versionId: requalificationIntervals.recipeVersionId,
      })
      .from(requalificationIntervals)
      .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
      .where(inArray(requalificationIntervals.id, ids));
    const versions = new Map(
      rows.length ? await recipeVersionLabels(db, [...new Set(rows.map((r) => r.versionId))]) : [],
    );
    return rows.map((r) => [r.id, `${r.family} on ${versions.get(r.versionId) ?? "a recipe"}`]);
  },
  requalification_matrix: async (db, ids) =>
    (
      await db
        .select({ id: requalificationMatrices.id, version: requalificationMatrices.version })
        .from(requalificationMatrices)
        .where(inArray(requalificationMatrices.id, ids))
    ).map((r) => [r.id, `Requalification matrix v${r.version}`]),
  maintenance_interval: async (db, ids) => {
    const rows = await db
      .select({
        id: maintenanceIntervals.id,
        kind: maintenanceIntervals.kind,
        stageId: maintenanceIntervals.stageId,
      })
      .from(maintenanceIntervals)
      .where(inArray(maintenanceIntervals.id, ids));
    const stages = new Map(
      rows.length ? await stageLabels(db, [...new Set(rows.map((r) => r.stageId))]) : [],
    );
    return rows.map((r) => [r.id, `${humanize(r.kind)} of ${stages.get(r.stageId) ?? "a tank"}`]);
  },
  bath_record: async (db, ids) => {
    const rows = await db
      .select({ id: bathRecords.id, kind: bathRecords.kind, stageId: bathRecords.stageId })
      .from(bathRecords)
      .where(inArray(bathRecords.id, ids));
    const stages = new Map(
      rows.length ? await stageLabels(db, [...new Set(rows.map((r) => r.stageId))]) : [],
    );
    return rows.map((r) => [r.id, `${humanize(r.kind)} on ${stages.get(r.stageId) ?? "a tank"}`]);
  },
};

/** SQLite's limit on bound values is far above this; chunks keep each IN list modest. */
const CHUNK = 500;

/**
 * Looks up the number and name of every record the audit events refer to (TR-0007,
 * CR-2025-001), one query per record type rather than one per row. A record type
 * without a lookup, or a record no longer found, keeps no label: the browser then
 * shows its type and id.
 */
export async function labelRecords(
  refs: { recordType: string; recordId: string }[],
): Promise<RecordLabeller> {
  const db = getDb();
  const byType = new Map<string, Set<string>>();
  for (const r of refs)
    if (LOOKUPS[r.recordType])
      byType.set(r.recordType, (byType.get(r.recordType) ?? new Set()).add(r.recordId));
  const labels = new Map<string, string>();
  for (const [type, idSet] of byType) {
    const ids = [...idSet];
    for (let i = 0; i < ids.length; i += CHUNK)
      for (const [id, label] of await LOOKUPS[type](db, ids.slice(i, i + CHUNK)))
        labels.set(`${type}:${id}`, label);
  }
  // The company record has one row and no id of its own.
  return (type, id) =>
    labels.get(`${type}:${id}`) ?? (type === "company" ? "Company settings" : undefined);
}
