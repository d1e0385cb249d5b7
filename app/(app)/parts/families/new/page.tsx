import type { Metadata } from "next";
import { PartFamilyForm } from "@/components/parts/part-family-form";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { specsInForce } from "@/lib/server/plant/parts-queries";
import { createPartFamilyAction } from "../../actions";

export const metadata: Metadata = { title: "New part family" };

export default async function NewPartFamilyPage() {
  await requirePageUser("parts.manage");
  const specs = await specsInForce();
  return (
    <>
      <PageHeader
        title="New part family"
        description="A family is the parts one recipe cleans to one specification: same material, similar geometry and wetted area."
      />
      {specs.length === 0 ? (
        <EmptyState title="No specification in force">
          Register the customer specification first: every part family must meet one.
        </EmptyState>
      ) : (
        <PartFamilyForm action={createPartFamilyAction} specs={specs} />
      )}
    </>
  );
}
