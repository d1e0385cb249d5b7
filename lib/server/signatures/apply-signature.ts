// Not "server-only": the demo seed signs deviations and nonconformances through it under tsx (it only writes in the caller's transaction).
import { and, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { signatures, type SignatureMeaning, type SignedRecordType } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { segregationProblem } from "@/lib/signatures/rules";
import { UserFacingError } from "@/lib/server/errors";

export interface SignatureInput {
  signer: { id: string; name: string };
  recordType: SignedRecordType;
  recordId: string;
  meaning: SignatureMeaning;
  /** SHA-256 of exactly the version being signed. */
  contentHash: string;
  comment?: string | null;
}

/**
 * Writes a signature bound to the record's content hash, inside the caller's
 * transaction (with the state change it brings about), and audits it.
 * Refuses a second signature of the same meaning on the same content (a version
 * that was sent back and changed is new content), and one person taking two
 * separated duties on the same record.
 */
export async function applySignature(tx: Tx, input: SignatureInput, now = new Date()) {
  const existing = await tx
    .select()
    .from(signatures)
    .where(
      and(eq(signatures.recordType, input.recordType), eq(signatures.recordId, input.recordId)),
    );
  const problem = segregationProblem(existing, {
    userId: input.signer.id,
    meaning: input.meaning,
    contentHash: input.contentHash,
  });
  if (problem) throw new UserFacingError(problem);
  const signedAt = now.toISOString();
  const [row] = await tx
    .insert(signatures)
    .values({
      recordType: input.recordType,
      recordId: input.recordId,
      userId: input.signer.id,
      printedName: input.signer.name,
      meaning: input.meaning,
      signedAt,
      contentHash: input.contentHash,
    })
    .returning();
  await appendAudit(
    tx,
    input.signer,
    {
      eventType: "signature.applied",
      recordType: "signature",
      recordId: row.id,
      new: {
        on: `${input.recordType}:${input.recordId}`,
        meaning: input.meaning,
        printedName: input.signer.name,
        contentHash: input.contentHash,
        signedAt,
      },
      reason: input.comment ?? null,
    },
    now,
  );
  return row;
}
