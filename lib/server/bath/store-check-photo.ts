import "server-only";
import { storeLooseFile } from "@/lib/server/evidence/store-loose-file";

/**
 * Stores the photo of a nozzle check or an ultrasonic foil test under its SHA-256, as an evidence
 * file bound to no run; the log entry saved afterwards cites its id.
 */
export async function storeCheckPhoto(
  actor: { id: string; name: string },
  input: { name: string; bytes: Uint8Array },
) {
  return storeLooseFile(actor, {
    ...input,
    kind: "photo",
    eventType: "evidence_file.check_photo_uploaded",
    refuse: (checked) =>
      checked.mime.startsWith("image/") ? null : "Choose a photo (JPEG or PNG).",
  });
}
