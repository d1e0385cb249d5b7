import { storeCheckPhoto } from "@/lib/server/bath/store-check-photo";
import { looseFileUpload } from "@/lib/server/evidence/loose-file-upload";

/** Uploads a nozzle-check or foil-test photo before the log entry is saved; answers the file's id for the form. */
export const POST = looseFileUpload({
  permission: "bath.record",
  missing: "Choose the photo.",
  store: storeCheckPhoto,
});
