// Not "server-only": the demo seed records training under tsx.
import { and, desc, eq, inArray } from "drizzle-orm";
import type { Executor, Tx } from "@/db/client";
import { labMethods, testRunMethods, trainingRecords, type TrainingRecord } from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import { trainingGateProblems } from "@/lib/training/rules";
import { applySignature } from "@/lib/server/signatures/apply-signature";

/** What the signature on a training record binds to. */
export function trainingContentHash(
  r: Pick<
    TrainingRecord,
    | "userId"
    | "kind"
    | "methodCode"
    | "methodId"
    | "documentId"
    | "documentVersionId"
    | "trainedOn"
    | "expiresOn"
    | "trainerId"
  >,
) {
  return sha256Hex(
    canonicalJson({
      userId: r.userId,
      kind: r.kind,
      methodCode: r.methodCode,
      methodId: r.methodId,
      documentId: r.documentId,
      documentVersionId: r.documentVersionId,
      trainedOn: r.trainedOn,
      expiresOn: r.expiresOn,
      trainerId: r.trainerId,
    }),
  );
}

/** A person's method sign-offs on the given codes, newest expiry first. */
export async function methodTrainingOf(db: Executor, userId: string, codes: readonly string[]) {
  if (codes.length === 0) return [];
  return db
    .select({ methodCode: trainingRecords.methodCode, expiresOn: trainingRecords.expiresOn })
    .from(trainingRecords)
    .where(
      and(
        eq(trainingRecords.userId, userId),
        eq(trainingRecords.kind, "method"),
        inArray(trainingRecords.methodCode, [...codes]),
      ),
    )
    .orderBy(desc(trainingRecords.expiresOn));
}

/** Why this person may not sign this run "performed" for want of training on a method it cites. */
export async function trainingProblemsForRun(
  db: Executor,
  runId: string,
  userId: string,
  today: string,
): Promise<string[]> {
  const cited = await db
    .select({ code: labMethods.code, version: labMethods.version, name: labMethods.name })
    .from(testRunMethods)
    .innerJoin(labMethods, eq(labMethods.id, testRunMethods.methodId))
    .where(eq(testRunMethods.runId, runId));
  if (cited.length === 0) return [];
  const records = await methodTrainingOf(
    db,
    userId,
    cited.map((c) => c.code),
  );
  return trainingGateProblems(
    cited,
    records.flatMap((r) =>
      r.methodCode ? [{ methodCode: r.methodCode, expiresOn: r.expiresOn }] : [],
    ),
    today,
  );
}

type TrainingValues = Parameters<typeof trainingContentHash>[0];

/** Writes a training record and the signature bound to its content, in the caller's transaction. */
export async function insertSignedTraining(
  tx: Tx,
  values: TrainingValues,
  signer: { id: string; name: string },
  meaning: "verified" | "reviewed",
  now: Date,
) {
  const contentHash = trainingContentHash(values);
  const [row] = await tx
    .insert(trainingRecords)
    .values({ ...values, createdAt: now.toISOString() })
    .returning({ id: trainingRecords.id });
  await applySignature(
    tx,
    { signer, recordType: "training_record", recordId: row.id, meaning, contentHash },
    now,
  );
  return { row, contentHash };
}
