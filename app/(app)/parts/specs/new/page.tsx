import type { Metadata } from "next";
import { SpecForm } from "@/components/parts/spec-form";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { familyOptions } from "@/lib/server/plant/parts-queries";
import { createSpecAction } from "../../actions";

export const metadata: Metadata = { title: "New specification" };

export default async function NewSpecPage() {
  await requirePageUser("parts.manage");
  const families = await familyOptions();
  return (
    <>
      <PageHeader
        title="New specification"
        description="A customer's cleanliness specification as issued: its document, revision and limits."
      />
      <SpecForm action={createSpecAction} families={families} />
    </>
  );
}
