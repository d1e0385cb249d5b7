import type { Metadata } from "next";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "Documents" };

export default async function DocumentsPage() {
  await requirePageUser("documents.view");
  return (
    <>
      <PageHeader title="Documents" description="Validation protocols (IQ, OQ, PQ), validation reports and procedures, with their versions and signatures." />
      <EmptyState title="No records yet">
        Controlled documents will be listed here with their number, version, status and effective date once an engineer drafts the first protocol.
      </EmptyState>
    </>
  );
}
