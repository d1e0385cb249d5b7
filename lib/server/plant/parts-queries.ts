import "server-only";
import { and, asc, desc, eq, inArray, or, sql, type SQL } from "drizzle-orm";
import type { SQLiteColumn } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db/client";
import {
  cleanlinessSpecs,
  evidenceFiles,
  partFamilies,
  partFamilyPictures,
  recipes,
  recipeVersions,
  requalificationIntervals,
  testRuns,
  users,
} from "@/db/schema";
import { requalificationDue } from "@/lib/changes/periodic";
import { formatDate } from "@/lib/format/date";
import type { CombinationExport, FamilyExport, SpecExport } from "@/lib/plant/master-data-export";

export async function getPartFamily(id: string) {
  const [row] = await getDb().select().from(partFamilies).where(eq(partFamilies.id, id));
  return row;
}

/** Whether an edit of the family needs a reason: the same rule updatePartFamily enforces. */
export async function familyInUse(id: string) {
  const db = getDb();
  const [run] = await db
    .select({ id: testRuns.id })
    .from(testRuns)
    .where(eq(testRuns.partFamilyId, id))
    .limit(1);
  const [combo] = await db
    .select({ id: requalificationIntervals.id })
    .from(requalificationIntervals)
    .where(eq(requalificationIntervals.partFamilyId, id))
    .limit(1);
  return Boolean(run || combo);
}

export type SpecStatusFilter = "in_force" | "superseded" | "all";

/** The register, filtered by status and by a word found in its code, title, customer or document number. */
export async function listSpecRegister({ status, q }: { status: SpecStatusFilter; q: string }) {
  const where: SQL[] = [];
  if (status !== "all") where.push(eq(cleanlinessSpecs.status, status));
  const word = q.trim();
  if (word) {
    // instr, not LIKE: the word is matched as typed, with no wildcard characters to escape.
    const has = (column: SQLiteColumn) =>
      sql`instr(lower(coalesce(${column}, '')), ${word.toLowerCase()}) > 0`;
    where.push(
      or(
        has(cleanlinessSpecs.code),
        has(cleanlinessSpecs.name),
        has(cleanlinessSpecs.customer),
        has(cleanlinessSpecs.documentNumber),
      )!,
    );
  }
  return getDb()
    .select()
    .from(cleanlinessSpecs)
    .where(where.length ? and(...where) : undefined)
    .orderBy(asc(cleanlinessSpecs.code), desc(cleanlinessSpecs.createdAt));
}

export async function getSpecWithHistory(id: string) {
  const db = getDb();
  const [spec] = await db.select().from(cleanlinessSpecs).where(eq(cleanlinessSpecs.id, id));
  if (!spec) return undefined;
  const revisions = await db
    .select()
    .from(cleanlinessSpecs)
    .where(eq(cleanlinessSpecs.code, spec.code))
    .orderBy(desc(cleanlinessSpecs.createdAt));
  const families = await db
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .where(eq(partFamilies.specId, id))
    .orderBy(asc(partFamilies.code));
  return { spec, revisions, families };
}

export async function specsInForce() {
  return getDb()
    .select({
      id: cleanlinessSpecs.id,
      code: cleanlinessSpecs.code,
      revision: cleanlinessSpecs.revision,
      name: cleanlinessSpecs.name,
    })
    .from(cleanlinessSpecs)
    .where(eq(cleanlinessSpecs.status, "in_force"))
    .orderBy(asc(cleanlinessSpecs.code));
}

export async function familyOptions() {
  return getDb()
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
}

/** Recipe versions that can be qualified by hand: the service accepts effective and superseded ones. */
export async function qualifiableVersions() {
  return getDb()
    .select({
      id: recipeVersions.id,
      code: recipes.code,
      name: recipes.name,
      version: recipeVersions.version,
      status: recipeVersions.status,
    })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(inArray(recipeVersions.status, ["effective", "superseded"]))
    .orderBy(asc(recipes.code), desc(recipeVersions.version));
}

export async function listCombinations() {
  const rows = await getDb()
    .select({
      id: requalificationIntervals.id,
      recipeCode: recipes.code,
      recipeId: recipes.id,
      recipeVersion: recipeVersions.version,
      recipeVersionStatus: recipeVersions.status,
      familyCode: partFamilies.code,
      familyName: partFamilies.name,
      basis: requalificationIntervals.basis,
      lastQualifiedAt: requalificationIntervals.lastQualifiedAt,
      intervalMonths: requalificationIntervals.intervalMonths,
      qualifiedBy: users.name,
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .leftJoin(users, eq(users.id, requalificationIntervals.qualifiedBy))
    .orderBy(asc(partFamilies.code), asc(recipes.code), desc(recipeVersions.version));
  return rows.map((r) => ({
    ...r,
    dueAt: requalificationDue(r.lastQualifiedAt, r.intervalMonths),
  }));
}

/** Everything the master-data export writes, in the shapes lib/plant/master-data-export.ts takes. */
export async function masterDataForExport(): Promise<{
  partFamilies: FamilyExport[];
  specifications: SpecExport[];
  combinations: CombinationExport[];
}> {
  const db = getDb();
  const families = await db
    .select({
      f: partFamilies,
      specCode: cleanlinessSpecs.code,
      specRevision: cleanlinessSpecs.revision,
    })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .orderBy(asc(partFamilies.code));
  const specs = await db
    .select()
    .from(cleanlinessSpecs)
    .orderBy(asc(cleanlinessSpecs.code), asc(cleanlinessSpecs.createdAt));
  const combos = await listCombinations();
  return {
    partFamilies: families.map(({ f, specCode, specRevision }) => ({
      ...f,
      specCode,
      specRevision,
    })),
    specifications: specs,
    combinations: combos.map((c) => ({
      recipeCode: c.recipeCode,
      recipeVersion: c.recipeVersion,
      recipeVersionStatus: c.recipeVersionStatus,
      familyCode: c.familyCode,
      basis: c.basis,
      qualifiedOn: formatDate(c.lastQualifiedAt),
      intervalMonths: c.intervalMonths,
      dueOn: formatDate(c.dueAt),
    })),
  };
}

/** The SHA-256 of the family's picture (its version for the browser's cache), or null when it has none. */
export async function familyPictureVersion(partFamilyId: string): Promise<string | null> {
  const [row] = await getDb()
    .select({ sha256: evidenceFiles.sha256 })
    .from(partFamilyPictures)
    .innerJoin(evidenceFiles, eq(evidenceFiles.id, partFamilyPictures.fileId))
    .where(eq(partFamilyPictures.partFamilyId, partFamilyId));
  return row?.sha256 ?? null;
}
