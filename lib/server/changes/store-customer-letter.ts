import "server-only";
import { storeLooseFile } from "@/lib/server/evidence/store-loose-file";

/**
 * Stores the customer's letter on a change under its SHA-256, as an evidence file bound to no
 * run; the decision recorded with it cites the file's id, so an auditor downloads exactly the
 * letter, re-hashed on the way out.
 */
export async function storeCustomerLetter(
  actor: { id: string; name: string },
  input: { name: string; bytes: Uint8Array },
) {
  return storeLooseFile(actor, {
    ...input,
    kind: "other",
    eventType: "evidence_file.customer_letter_uploaded",
  });
}
