import "server-only";
import { and, asc, count, eq, gt, inArray, ne, notInArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  documents,
  documentVersions,
  labMethods,
  trainingRecords,
  userRoles,
  users,
} from "@/db/schema";
import {
  latestExpiry,
  REMINDER_DAYS,
  trainingState,
  type TrainingState,
} from "@/lib/training/rules";
import { anyFieldContains, LIST_PAGE_SIZE, searchWords } from "@/lib/server/list-query";

export interface MatrixColumn {
  /** `method:<code>` or `procedure:<document id>`. */
  key: string;
  kind: "method" | "procedure";
  label: string;
  title: string;
  /** The approved method version, or the effective procedure version. */
  subjectId: string;
}

export interface MatrixCell {
  state: TrainingState;
  expiresOn: string | null;
}

/**
 * People × lab methods and procedures: for each approved method (by code) the person's newest
 * sign-off, for each procedure in force that anyone has acknowledged the newest acknowledgement
 * of its effective version.
 * Everyone who works in the plant is a row; auditors only read.
 */
export async function loadTrainingMatrix(today: string) {
  const db = getDb();
  const [people, methods, procedures] = await Promise.all([
    db
      .selectDistinct({ id: users.id, name: users.name, email: users.email })
      .from(users)
      .innerJoin(userRoles, eq(userRoles.userId, users.id))
      .where(and(eq(users.active, true), ne(userRoles.role, "auditor")))
      .orderBy(asc(users.name)),
    db
      .select()
      .from(labMethods)
      .where(eq(labMethods.status, "approved"))
      .orderBy(asc(labMethods.code)),
    // A procedure becomes a column once anyone has acknowledged any version of it: a plant's library
    // holds thousands of procedures, and a column per procedure made the matrix tens of megabytes.
    db
      .select({
        documentId: documents.id,
        number: documents.number,
        title: documents.title,
        versionId: documentVersions.id,
        version: documentVersions.version,
      })
      .from(documentVersions)
      .innerJoin(documents, eq(documents.id, documentVersions.documentId))
      .where(
        and(
          eq(documents.type, "procedure"),
          eq(documentVersions.status, "effective"),
          inArray(
            documents.id,
            db
              .select({ documentId: documentVersions.documentId })
              .from(trainingRecords)
              .innerJoin(
                documentVersions,
                eq(documentVersions.id, trainingRecords.documentVersionId),
              )
              .where(eq(trainingRecords.kind, "procedure")),
          ),
        ),
      )
      .orderBy(asc(documents.number)),
  ]);
  const columns: MatrixColumn[] = [
    ...methods.map((m) => ({
      key: `method:${m.code}`,
      kind: "method" as const,
      label: `${m.code} v${m.version}`,
      title: m.name,
      subjectId: m.id,
    })),
    ...procedures.map((p) => ({
      key: `procedure:${p.documentId}`,
      kind: "procedure" as const,
      label: `${p.number} v${p.version}`,
      title: p.title,
      subjectId: p.versionId,
    })),
  ];
  const ids = people.map((p) => p.id);
  const records =
    ids.length === 0
      ? []
      : await db
          .select({
            userId: trainingRecords.userId,
            kind: trainingRecords.kind,
            methodCode: trainingRecords.methodCode,
            documentVersionId: trainingRecords.documentVersionId,
            expiresOn: trainingRecords.expiresOn,
          })
          .from(trainingRecords)
          .where(inArray(trainingRecords.userId, ids));
  const effective = new Map(procedures.map((p) => [p.versionId, p.documentId]));
  const latest = latestExpiry(
    records.flatMap((r) => {
      if (r.kind === "method" && r.methodCode)
        return [{ key: `${r.userId}|method:${r.methodCode}`, expiresOn: r.expiresOn }];
      const doc = r.documentVersionId ? effective.get(r.documentVersionId) : undefined;
      return doc ? [{ key: `${r.userId}|procedure:${doc}`, expiresOn: r.expiresOn }] : [];
    }),
  );
  const rows = people.map((p) => ({
    person: p,
    cells: columns.map((c): MatrixCell => {
      const expiresOn = latest.get(`${p.id}|${c.key}`) ?? null;
      return { state: trainingState(expiresOn, today), expiresOn };
    }),
  }));
  return { columns, rows, methods };
}

/**
 * The procedure versions in force that the person has still to acknowledge (never, lapsed, or
 * expiring within the reminder window), matching the search words, by number: the first
 * LIST_PAGE_SIZE and how many match. A plant's library holds thousands of procedures.
 */
export async function proceduresToAcknowledge(userId: string, today: string, search?: string) {
  const db = getDb();
  const currentUntil = new Date(Date.parse(`${today}T00:00:00Z`) + REMINDER_DAYS * 86_400_000)
    .toISOString()
    .slice(0, 10);
  const currentlyAcknowledged = db
    .select({ versionId: trainingRecords.documentVersionId })
    .from(trainingRecords)
    .where(
      and(
        eq(trainingRecords.userId, userId),
        eq(trainingRecords.kind, "procedure"),
        gt(trainingRecords.expiresOn, currentUntil),
      ),
    );
  const where = and(
    eq(documents.type, "procedure"),
    eq(documentVersions.status, "effective"),
    notInArray(documentVersions.id, currentlyAcknowledged),
    ...searchWords(search).map((w) => anyFieldContains(w, [documents.number, documents.title])),
  );
  const [{ total }] = await db
    .select({ total: count() })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(where);
  const procedures = await db
    .select({
      versionId: documentVersions.id,
      number: documents.number,
      title: documents.title,
      version: documentVersions.version,
    })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(where)
    .orderBy(asc(documents.number))
    .limit(LIST_PAGE_SIZE);
  return { procedures, total };
}
