import type { Metadata } from "next";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "Trace" };

export default async function TracePage() {
  await requirePageUser("trace.view");
  return (
    <>
      <PageHeader title="Trace" description="Every value a recipe parameter has had, who changed it, why, who approved it and which evidence requalified it." />
      <EmptyState title="No records yet">
        The timeline of a chosen parameter will appear here. Each seeded recipe parameter has so far held one value only, from its first effective version; changes made through change control will add to its history.
      </EmptyState>
    </>
  );
}
