import type { Metadata } from "next";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "Evidence" };

export default async function EvidencePage() {
  await requirePageUser("evidence.view");
  return (
    <>
      <PageHeader title="Evidence" description="Test runs with their raw results, lab files and computed outcomes." />
      <EmptyState title="No records yet">
        Test runs will be listed here with their computed outcome, who performed them and who verified them once the first result is recorded.
      </EmptyState>
    </>
  );
}
