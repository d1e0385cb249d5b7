import "server-only";
import { and, asc, count, desc, eq, inArray, like, sql } from "drizzle-orm";
import type { SQLiteSelect } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequests,
  cleaningSystems,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  requalificationMatrices,
  signatures,
  testRuns,
  users,
  emergencyChanges,
} from "@/db/schema";
import { signatureValidity } from "@/lib/signatures/rules";
import { loadGate, loadRecipeSnapshot } from "./snapshot";
import { anyFieldContains, pageWithin, searchWords } from "@/lib/server/list-query";
import type { ChangeKind, ChangeStatus } from "@/lib/changes/workflow";
import { getEffectiveMatrix, loadChangeState } from "./state";

export interface ChangeListQuery {
  status?: string;
  kind?: string;
  /** Words that must each appear in the number, title, recipe code or author ("emergency" too, while it shows). */
  q?: string;
  page?: number;
}

/**
 * One page of change requests, newest first, and how many match: filtered and paged in SQL,
 * since a plant's changes run to tens of thousands.
 */
export async function listChangeRequests(query: ChangeListQuery = {}) {
  const db = getDb();
  // The word "Emergency" shows on a change until it is closed, rejected or withdrawn.
  const words = searchWords(query.q);
  const emergencyLabel = sql`case when ${emergencyChanges.implementedAt} is not null and ${changeRequests.status} not in ('closed', 'rejected', 'withdrawn') then 'Emergency' else '' end`;
  const where = and(
    query.status ? eq(changeRequests.status, query.status as ChangeStatus) : undefined,
    query.kind ? eq(changeRequestAssessments.kind, query.kind as ChangeKind) : undefined,
    ...words.map((w) =>
      anyFieldContains(w, [
        changeRequests.number,
        changeRequests.title,
        recipes.code,
        users.name,
        emergencyLabel,
      ]),
    ),
  );
  const joined = <T extends SQLiteSelect>(q: T, names = true) => {
    const assessed = q.innerJoin(
      changeRequestAssessments,
      eq(changeRequestAssessments.changeRequestId, changeRequests.id),
    );
    // Recipe, author and emergency are at most one row each per change (required keys), so a
    // count without search words leaves them out.
    return (
      names
        ? assessed
            .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
            .innerJoin(users, eq(users.id, changeRequests.createdBy))
            .leftJoin(emergencyChanges, eq(emergencyChanges.changeRequestId, changeRequests.id))
        : assessed
    ).where(where);
  };
  const [{ total }] = await joined(
    db.select({ total: count() }).from(changeRequests).$dynamic(),
    words.length > 0,
  );
  const { page, pages, offset, limit } = pageWithin(total, query.page);
  const rows = await joined(
    db
      .select({
        id: changeRequests.id,
        number: changeRequests.number,
        title: changeRequests.title,
        status: changeRequests.status,
        impact: changeRequests.impact,
        kind: changeRequestAssessments.kind,
        recipeCode: recipes.code,
        recipeId: recipes.id,
        createdAt: changeRequests.createdAt,
        closedAt: changeRequests.closedAt,
        author: users.name,
        /** Set when the change was implemented as an emergency before approval. */
        emergencyAt: emergencyChanges.implementedAt,
      })
      .from(changeRequests)
      .$dynamic(),
  )
    .orderBy(desc(changeRequests.createdAt), desc(changeRequests.number))
    .limit(limit)
    .offset(offset);
  return { rows, total, page, pages };
}

/** Whether any change request exists: an empty list shows how to begin, not "no matches". */
export async function hasChangeRequests() {
  const [row] = await getDb().select({ id: changeRequests.id }).from(changeRequests).limit(1);
  return row !== undefined;
}

/** The change request page: state, gate, signatures of every revision, and runs that could be linked. */
/** A change request's number, title and status alone: enough to name one whose full page cannot be built. */
export async function getChangeRequestHeading(changeRequestId: string) {
  const [row] = await getDb()
    .select({
      number: changeRequests.number,
      title: changeRequests.title,
      status: changeRequests.status,
      createdAt: changeRequests.createdAt,
      recipeCode: recipes.code,
      author: users.name,
    })
    .from(changeRequests)
    .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
    .innerJoin(users, eq(users.id, changeRequests.createdBy))
    .where(eq(changeRequests.id, changeRequestId));
  return row ?? null;
}

/** The change request a change narrative document belongs to: its routing is the change's steps. */
export async function changeOfNarrative(documentId: string) {
  const [row] = await getDb()
    .select({ id: changeRequests.id, number: changeRequests.number })
    .from(changeRequests)
    .where(eq(changeRequests.narrativeDocumentId, documentId));
  return row ?? null;
}

export async function getChangeRequestPage(changeRequestId: string) {
  const db = getDb();
  const state = await loadChangeState(db, changeRequestId);
  const { requirements: stored, linked, gate } = await loadGate(db, changeRequestId);
  const sigs = await db
    .select()
    .from(signatures)
    .where(
      and(
        eq(signatures.recordType, "change_request"),
        like(signatures.recordId, `${changeRequestId}#%`),
      ),
    )
    .orderBy(asc(signatures.signedAt));
  const current = sigs
    .filter((s) => s.recordId === state.signatureRecordId)
    .map((s) => ({ ...s, validity: signatureValidity(s.contentHash, state.contentHash) }));
  const earlier = sigs
    .filter((s) => s.recordId !== state.signatureRecordId)
    .map((s) => ({ ...s, validity: "invalid" as const }));
  const candidates = state.toVersion
    ? await db
        .select()
        .from(testRuns)
        .where(
          and(
            eq(testRuns.recipeVersionId, state.toVersion.id),
            inArray(testRuns.testType, stored.length ? stored.map((r) => r.testType) : ["visual"]),
          ),
        )
    : [];
  const [author] = await db
    .select({ name: users.name })
    .from(users)
    .where(eq(users.id, state.cr.createdBy));
  const families = await db
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
  return {
    ...state,
    stored,
    linked,
    gate,
    signatures: current,
    earlierSignatures: earlier,
    candidates,
    author: author?.name ?? "",
    families,
  };
}

/** A recipe with every version, the effective version's content, its validated part families and its changes. */
export async function getRecipePage(recipeId: string) {
  const db = getDb();
  const [row] = await db
    .select({ recipe: recipes, system: cleaningSystems })
    .from(recipes)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(eq(recipes.id, recipeId));
  if (!row) return undefined;
  const versions = await db
    .select()
    .from(recipeVersions)
    .where(eq(recipeVersions.recipeId, recipeId))
    .orderBy(desc(recipeVersions.version));
  const effective = versions.find((v) => v.status === "effective") ?? null;
  const content = effective ? await loadRecipeSnapshot(db, effective.id) : null;
  const intervals = effective
    ? await db
        .select({ interval: requalificationIntervals, family: partFamilies })
        .from(requalificationIntervals)
        .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
        .where(eq(requalificationIntervals.recipeVersionId, effective.id))
    : [];
  const changes = await db
    .select()
    .from(changeRequests)
    .where(eq(changeRequests.recipeId, recipeId))
    .orderBy(desc(changeRequests.createdAt));
  return { ...row, versions, effective, content, intervals, changes };
}

/** One version of a recipe as it stands (earlier, proposed or effective), for reading only, with the change requests that proposed it. */
export async function getRecipeVersionPage(recipeId: string, version: number) {
  const db = getDb();
  const [row] = await db
    .select({ recipe: recipes, system: cleaningSystems, v: recipeVersions })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(and(eq(recipeVersions.recipeId, recipeId), eq(recipeVersions.version, version)));
  if (!row) return undefined;
  const content = await loadRecipeSnapshot(db, row.v.id);
  const proposedBy = await db
    .select()
    .from(changeRequests)
    .where(eq(changeRequests.toVersionId, row.v.id))
    .orderBy(desc(changeRequests.createdAt));
  return { recipe: row.recipe, system: row.system, version: row.v, content, proposedBy };
}

export async function getMatrixPage() {
  const db = getDb();
  const [matrix, versions] = await Promise.all([
    getEffectiveMatrix(db),
    db.select().from(requalificationMatrices).orderBy(desc(requalificationMatrices.version)),
  ]);
  return { matrix, versions };
}
