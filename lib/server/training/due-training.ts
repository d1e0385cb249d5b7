import "server-only";
import { and, eq, inArray, lte } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documents, documentVersions, labMethods, trainingRecords } from "@/db/schema";
import { REMINDER_DAYS } from "@/lib/training/rules";

const addDays = (day: string, days: number) =>
  new Date(Date.parse(`${day}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

/**
 * The newest training of each person on each approved method or effective procedure version that
 * lapses within the notice period or has lapsed: what to retrain. Older records a later sign-off
 * replaced are left out.
 */
export async function dueTraining(today: string, userId?: string) {
  const db = getDb();
  const horizon = addDays(today, REMINDER_DAYS);
  const near = await db
    .select()
    .from(trainingRecords)
    .where(
      and(
        lte(trainingRecords.expiresOn, horizon),
        userId ? eq(trainingRecords.userId, userId) : undefined,
      ),
    );
  if (near.length === 0) return [];
  const users = [...new Set(near.map((r) => r.userId))];
  const all = await db
    .select({
      userId: trainingRecords.userId,
      methodCode: trainingRecords.methodCode,
      documentVersionId: trainingRecords.documentVersionId,
      expiresOn: trainingRecords.expiresOn,
    })
    .from(trainingRecords)
    .where(inArray(trainingRecords.userId, users));
  const subject = (r: { methodCode: string | null; documentVersionId: string | null }) =>
    r.methodCode ? `m:${r.methodCode}` : `p:${r.documentVersionId}`;
  const newest = new Map<string, string>();
  for (const r of all) {
    const k = `${r.userId}|${subject(r)}`;
    if ((newest.get(k) ?? "") < r.expiresOn) newest.set(k, r.expiresOn);
  }
  const [methods, procedures] = await Promise.all([
    db
      .select({ code: labMethods.code, version: labMethods.version, name: labMethods.name })
      .from(labMethods)
      .where(eq(labMethods.status, "approved")),
    db
      .select({
        id: documentVersions.id,
        number: documents.number,
        version: documentVersions.version,
      })
      .from(documentVersions)
      .innerJoin(documents, eq(documents.id, documentVersions.documentId))
      .where(and(eq(documents.type, "procedure"), eq(documentVersions.status, "effective"))),
  ]);
  const methodByCode = new Map(methods.map((m) => [m.code, m]));
  const procedureById = new Map(procedures.map((p) => [p.id, p]));
  return near.flatMap((r) => {
    if (newest.get(`${r.userId}|${subject(r)}`) !== r.expiresOn) return [];
    const label = r.methodCode
      ? methodByCode.has(r.methodCode)
        ? `${r.methodCode} ${methodByCode.get(r.methodCode)!.name}`
        : null
      : r.documentVersionId && procedureById.has(r.documentVersionId)
        ? `${procedureById.get(r.documentVersionId)!.number} v${procedureById.get(r.documentVersionId)!.version}`
        : null;
    return label ? [{ record: r, label }] : [];
  });
}
