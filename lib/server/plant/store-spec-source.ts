import "server-only";
import { storeLooseFile } from "@/lib/server/evidence/store-loose-file";

/**
 * Stores a customer specification's source document under its SHA-256, as an evidence file bound
 * to no run (the run-bound store requires an open run). The register row cites the file's id, so
 * an auditor downloads exactly the document the limits were typed from, re-hashed on the way out.
 */
export async function storeSpecSource(
  actor: { id: string; name: string },
  input: { name: string; bytes: Uint8Array },
) {
  return storeLooseFile(actor, {
    ...input,
    kind: "other",
    eventType: "evidence_file.spec_source_uploaded",
  });
}
