import { looseFileUpload } from "@/lib/server/evidence/loose-file-upload";
import { storeCertificate } from "@/lib/server/instruments/store-certificate";

/** Uploads a calibration certificate before the calibration is saved; answers the file's id for the form. */
export const POST = looseFileUpload({
  permission: "instrument.manage",
  missing: "Choose the certificate file.",
  store: storeCertificate,
});
