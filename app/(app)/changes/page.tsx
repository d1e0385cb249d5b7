import type { Metadata } from "next";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "Changes" };

export default async function ChangesPage() {
  await requirePageUser("changes.view");
  return (
    <>
      <PageHeader title="Changes" description="Change requests against effective recipe versions: parameter diff, computed impact, approval and requalification." />
      <EmptyState title="No records yet">
        Change requests will be listed here with their impact class, status and requalification progress once an engineer opens one from an effective recipe version.
      </EmptyState>
    </>
  );
}
