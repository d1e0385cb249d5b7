import type { Metadata } from "next";
import { NewDocumentForm } from "@/components/documents/new-document-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listLinkOptions } from "@/lib/server/documents/queries";
import { createDocumentAction } from "../actions";

export const metadata: Metadata = { title: "New document" };

export default async function NewDocumentPage() {
  await requirePageUser("document.draft");
  const options = await listLinkOptions();
  return (
    <>
      <PageHeader
        title="New document"
        description="Washproof numbers the document and writes a first draft from the template for its type, filled in from the cleaning system, part family and recipe you link."
      />
      <NewDocumentForm action={createDocumentAction} options={options} />
    </>
  );
}
