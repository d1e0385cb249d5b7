import { looseFileUpload } from "@/lib/server/evidence/loose-file-upload";
import { storeSpecSource } from "@/lib/server/plant/store-spec-source";

/** Uploads a specification's source document before the register form is saved; answers the file's id for the form. */
export const POST = looseFileUpload({
  permission: "parts.manage",
  missing: "Choose the specification's source document.",
  store: storeSpecSource,
});
