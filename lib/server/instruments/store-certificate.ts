import "server-only";
import { storeLooseFile } from "@/lib/server/evidence/store-loose-file";

/** Stores a calibration certificate before the calibration is recorded; the record cites its id. */
export async function storeCertificate(
  actor: { id: string; name: string },
  input: { name: string; bytes: Uint8Array },
) {
  return storeLooseFile(actor, {
    ...input,
    kind: "other",
    eventType: "evidence_file.certificate_uploaded",
  });
}
