// Not "server-only": the demo seed drafts and approves its methods under tsx.
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { labMethods, signatures, testRuns, users, type LabMethod } from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { notFoundError } from "@/lib/server/errors";

/** What an approval binds to: everything that defines the method version, not its status. */
export function methodContentHash(
  m: Pick<
    LabMethod,
    | "code"
    | "version"
    | "kind"
    | "name"
    | "details"
    | "qualificationRunId"
    | "trainingIntervalMonths"
  >,
) {
  return sha256Hex(
    canonicalJson({
      code: m.code,
      version: m.version,
      kind: m.kind,
      name: m.name,
      details: m.details,
      qualificationRunId: m.qualificationRunId,
      trainingIntervalMonths: m.trainingIntervalMonths,
    }),
  );
}

export const methodLabel = (m: Pick<LabMethod, "code" | "version">) => `${m.code} v${m.version}`;

/** One method version with its signatures, author, qualification run and sibling versions. */
export async function loadMethod(db: Executor, methodId: string) {
  const [row] = await db
    .select({ method: labMethods, author: users.name })
    .from(labMethods)
    .innerJoin(users, eq(users.id, labMethods.createdBy))
    .where(eq(labMethods.id, methodId));
  if (!row) throw notFoundError("This lab method does not exist.");
  const method = row.method;
  const [sigs, versions, qualification] = await Promise.all([
    db
      .select()
      .from(signatures)
      .where(and(eq(signatures.recordType, "lab_method"), eq(signatures.recordId, method.id)))
      .orderBy(asc(signatures.signedAt)),
    db
      .select({
        id: labMethods.id,
        version: labMethods.version,
        status: labMethods.status,
        approvedAt: labMethods.approvedAt,
      })
      .from(labMethods)
      .where(eq(labMethods.code, method.code))
      .orderBy(desc(labMethods.version)),
    method.qualificationRunId
      ? db
          .select({ id: testRuns.id, number: testRuns.number, revision: testRuns.revision })
          .from(testRuns)
          .where(eq(testRuns.id, method.qualificationRunId))
      : Promise.resolve([]),
  ]);
  return {
    method,
    author: row.author,
    signatures: sigs,
    versions,
    qualification: qualification[0] ?? null,
    contentHash: methodContentHash(method),
  };
}

/** Method versions by id, for citations and the training gate. */
export async function methodsByIds(db: Executor, ids: readonly string[]) {
  if (ids.length === 0) return [];
  return db
    .select()
    .from(labMethods)
    .where(inArray(labMethods.id, [...ids]));
}
