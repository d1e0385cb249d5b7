import { storeCustomerLetter } from "@/lib/server/changes/store-customer-letter";
import { looseFileUpload } from "@/lib/server/evidence/loose-file-upload";

/** Uploads the customer's letter on a change before its decision is recorded; answers the file's id for the form. */
export const POST = looseFileUpload({
  permission: "change.draft",
  missing: "Choose the customer's letter.",
  store: storeCustomerLetter,
});
