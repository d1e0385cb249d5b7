import type { Metadata } from "next";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";

export const metadata: Metadata = { title: "My queue" };

export default async function QueuePage() {
  const user = await requirePageUser("queue.view");
  return (
    <>
      <PageHeader title="My queue" description={`What is waiting for you, ${user.name.split(" ")[0]}.`} />
      <EmptyState title="Nothing is waiting for you">
        Reviews and approvals assigned to you, drafts sent back to you, tests to perform or verify, and bath
        maintenance that falls due will be listed here as they arise.
      </EmptyState>
    </>
  );
}
