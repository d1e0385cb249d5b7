import "server-only";
import { and, asc, count, desc, eq, inArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { getDb } from "@/db/client";
import {
  cleaningSystems,
  documentReviews,
  documentRoundTexts,
  documents,
  documentVersions,
  partFamilies,
  recipes,
  recipeVersions,
  userRoles,
  users,
} from "@/db/schema";
import type { RichDoc } from "@/lib/documents/rich-text";
import type { Document, DocumentVersion } from "@/db/schema";
import { listSignatures } from "@/lib/server/signatures/queries";
import { anyFieldContains, pageWithin, searchWords } from "@/lib/server/list-query";

export interface DocumentListQuery {
  type?: string;
  /** The latest version's status. */
  status?: string;
  /** Words that must each appear in the number, title or owner's name (any case). */
  q?: string;
  page?: number;
}

/**
 * One page of documents by number, each with its latest version and the version in force, and
 * how many documents match: filtered and paged in SQL, since a plant's library runs to thousands.
 */
export async function listDocuments(query: DocumentListQuery = {}) {
  const db = getDb();
  const latest = alias(documentVersions, "latest");
  const inForce = alias(documentVersions, "in_force");
  const words = searchWords(query.q);
  const where = and(
    query.type ? eq(documents.type, query.type as Document["type"]) : undefined,
    query.status ? eq(latest.status, query.status as DocumentVersion["status"]) : undefined,
    ...words.map((w) => anyFieldContains(w, [documents.number, documents.title, users.name])),
  );
  const newest = sql`(select max(v.version) from ${documentVersions} v where v.document_id = ${documents.id})`;
  const from = () =>
    db
      .select({
        document: documents,
        owner: users.name,
        systemCode: cleaningSystems.code,
        latest: { version: latest.version, status: latest.status },
        effective: { version: inForce.version, effectiveDate: inForce.effectiveDate },
      })
      .from(documents)
      .innerJoin(users, eq(users.id, documents.ownerId))
      .leftJoin(cleaningSystems, eq(cleaningSystems.id, documents.systemId))
      .innerJoin(latest, and(eq(latest.documentId, documents.id), eq(latest.version, newest)))
      .leftJoin(inForce, and(eq(inForce.documentId, documents.id), eq(inForce.status, "effective")))
      .where(where);
  // Every document has an owner and a version from its creation, so the count joins them only
  // when a filter reads them.
  let counted = db.select({ total: count() }).from(documents).$dynamic();
  if (words.length > 0) counted = counted.innerJoin(users, eq(users.id, documents.ownerId));
  if (query.status)
    counted = counted.innerJoin(
      latest,
      and(eq(latest.documentId, documents.id), eq(latest.version, newest)),
    );
  const [{ total }] = await counted.where(where);
  const { page, pages, offset, limit } = pageWithin(total, query.page);
  const rows = await from().orderBy(asc(documents.number)).limit(limit).offset(offset);
  return {
    total,
    page,
    pages,
    rows: rows.map(({ document, owner, systemCode, latest, effective }) => ({
      ...document,
      owner,
      systemCode,
      latest,
      effective: effective?.version != null ? effective : null,
    })),
  };
}

/** Whether any document exists: an empty library shows how to begin, not "no matches". */
export async function hasDocuments() {
  const [row] = await getDb().select({ id: documents.id }).from(documents).limit(1);
  return row !== undefined;
}

export type DocumentListRow = Awaited<ReturnType<typeof listDocuments>>["rows"][number];

export async function getDocument(documentId: string) {
  const db = getDb();
  const [row] = await db
    .select({
      document: documents,
      owner: users.name,
      system: cleaningSystems,
      family: partFamilies,
    })
    .from(documents)
    .innerJoin(users, eq(users.id, documents.ownerId))
    .leftJoin(cleaningSystems, eq(cleaningSystems.id, documents.systemId))
    .leftJoin(partFamilies, eq(partFamilies.id, documents.partFamilyId))
    .where(eq(documents.id, documentId));
  if (!row) return null;
  const [recipe] = row.document.recipeVersionId
    ? await db
        .select({
          code: recipes.code,
          name: recipes.name,
          version: recipeVersions.version,
          status: recipeVersions.status,
        })
        .from(recipeVersions)
        .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
        .where(eq(recipeVersions.id, row.document.recipeVersionId))
    : [];
  const versions = await db
    .select({
      id: documentVersions.id,
      version: documentVersions.version,
      status: documentVersions.status,
      effectiveDate: documentVersions.effectiveDate,
      submittedAt: documentVersions.submittedAt,
      approvedAt: documentVersions.approvedAt,
      changeReason: documentVersions.changeReason,
      createdAt: documentVersions.createdAt,
    })
    .from(documentVersions)
    .where(eq(documentVersions.documentId, documentId))
    .orderBy(desc(documentVersions.version));
  return {
    ...row.document,
    owner: row.owner,
    system: row.system,
    family: row.family,
    recipe: recipe ?? null,
    versions,
  };
}

export type DocumentDetail = NonNullable<Awaited<ReturnType<typeof getDocument>>>;

/** One version with its content, routing (all rounds) and signatures checked against its current hash. */
export async function getVersion(documentId: string, versionNumber: number) {
  const db = getDb();
  const [version] = await db
    .select()
    .from(documentVersions)
    .where(
      and(eq(documentVersions.documentId, documentId), eq(documentVersions.version, versionNumber)),
    );
  if (!version) return null;
  const reviews = await db
    .select({ review: documentReviews, name: users.name })
    .from(documentReviews)
    .innerJoin(users, eq(users.id, documentReviews.assigneeId))
    .where(eq(documentReviews.versionId, version.id))
    .orderBy(
      desc(documentReviews.round),
      asc(documentReviews.step),
      asc(documentReviews.createdAt),
    );
  const signatures = await listSignatures("document_version", version.id, version.contentHash);
  return {
    ...version,
    content: version.content as RichDoc,
    reviews: reviews.map((r) => ({ ...r.review, name: r.name })),
    signatures,
  };
}

export type VersionDetail = NonNullable<Awaited<ReturnType<typeof getVersion>>>;

/** People who may be picked for routing: active holders of the reviewer and approver roles. */
export async function listSigners() {
  const rows = await getDb()
    .select({ id: users.id, name: users.name, jobTitle: users.jobTitle, role: userRoles.role })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(eq(users.active, true), inArray(userRoles.role, ["reviewer", "approver"])))
    .orderBy(asc(users.name));
  const pick = (role: string) =>
    rows.filter((r) => r.role === role).map(({ id, name, jobTitle }) => ({ id, name, jobTitle }));
  return { reviewers: pick("reviewer"), approvers: pick("approver") };
}

/** Choices for a new document's links. */
export async function listLinkOptions() {
  const db = getDb();
  const systems = await db
    .select({ id: cleaningSystems.id, code: cleaningSystems.code, name: cleaningSystems.name })
    .from(cleaningSystems)
    .orderBy(asc(cleaningSystems.code));
  const families = await db
    .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
    .from(partFamilies)
    .orderBy(asc(partFamilies.code));
  const recipeRows = await db
    .select({
      id: recipeVersions.id,
      code: recipes.code,
      name: recipes.name,
      version: recipeVersions.version,
      status: recipeVersions.status,
      systemId: recipes.systemId,
    })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .orderBy(asc(recipes.code), desc(recipeVersions.version));
  return { systems, families, recipes: recipeRows };
}

/** A document and the version a page asked for (?version=N), the latest when none; null when either is missing. */
export async function getDocumentAndVersion(documentId: string, versionParam: string | undefined) {
  const document = await getDocument(documentId);
  if (!document) return null;
  const version = await getVersion(
    documentId,
    Number(versionParam) || document.versions[0].version,
  );
  return version ? { document, version } : null;
}

/** The text of a version as submitted in one review round, or null when it was not kept (rounds before texts were kept). */
export async function getRoundText(versionId: string, round: number): Promise<RichDoc | null> {
  const [row] = await getDb()
    .select({ content: documentRoundTexts.content })
    .from(documentRoundTexts)
    .where(and(eq(documentRoundTexts.versionId, versionId), eq(documentRoundTexts.round, round)));
  return row ? (row.content as RichDoc) : null;
}
