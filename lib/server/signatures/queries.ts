import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { signatures, type SignedRecordType } from "@/db/schema";
import { signatureValidity } from "@/lib/signatures/rules";

/** The signatures on a record, each marked valid or invalid against the record's current hash. */
export async function listSignatures(
  recordType: SignedRecordType,
  recordId: string,
  currentHash: string | null,
) {
  const rows = await getDb()
    .select()
    .from(signatures)
    .where(and(eq(signatures.recordType, recordType), eq(signatures.recordId, recordId)))
    .orderBy(asc(signatures.signedAt));
  return rows.map((s) => ({ ...s, validity: signatureValidity(s.contentHash, currentHash) }));
}
