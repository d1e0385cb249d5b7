// Not "server-only": the demo seed records its technician's acknowledgements under tsx.
import { and, desc, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { documents, documentVersions, trainingRecords } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { todayUtc } from "@/lib/format/date";
import { addMonths, DEFAULT_INTERVAL_MONTHS, trainingState } from "@/lib/training/rules";
import { UserFacingError } from "@/lib/server/errors";
import { insertSignedTraining } from "./state";

/**
 * A person signs that they have read and understood the effective version of a controlled
 * procedure; current for the default interval, and again for each new version.
 */
export async function acknowledgeProcedureIn(
  tx: Tx,
  person: { id: string; name: string },
  input: { documentVersionId: string },
  now = new Date(),
) {
  const today = todayUtc(now);
  const [found] = await tx
    .select({ version: documentVersions, document: documents })
    .from(documentVersions)
    .innerJoin(documents, eq(documents.id, documentVersions.documentId))
    .where(eq(documentVersions.id, input.documentVersionId));
  if (!found || found.document.type !== "procedure" || found.version.status !== "effective")
    throw new UserFacingError("Choose a procedure version in force.", {
      kind: "invalid",
      field: "documentVersionId",
    });
  const [latest] = await tx
    .select({ expiresOn: trainingRecords.expiresOn })
    .from(trainingRecords)
    .where(
      and(
        eq(trainingRecords.userId, person.id),
        eq(trainingRecords.documentVersionId, input.documentVersionId),
      ),
    )
    .orderBy(desc(trainingRecords.expiresOn))
    .limit(1);
  if (latest && trainingState(latest.expiresOn, today) === "current")
    throw new UserFacingError(
      `You have acknowledged this version already; it stays current until ${latest.expiresOn}.`,
      { field: "documentVersionId" },
    );
  const values = {
    userId: person.id,
    kind: "procedure" as const,
    methodCode: null,
    methodId: null,
    documentId: found.document.id,
    documentVersionId: found.version.id,
    trainedOn: today,
    expiresOn: addMonths(today, DEFAULT_INTERVAL_MONTHS),
    trainerId: null,
  };
  const { row, contentHash } = await insertSignedTraining(tx, values, person, "reviewed", now);
  const procedure = `${found.document.number} v${found.version.version}`;
  await appendAudit(
    tx,
    person,
    {
      eventType: "training.procedure_acknowledged",
      recordType: "training_record",
      recordId: row.id,
      new: {
        person: person.name,
        procedure,
        trainedOn: today,
        expiresOn: values.expiresOn,
        contentHash,
      },
    },
    now,
  );
  return { id: row.id, procedure, expiresOn: values.expiresOn };
}
