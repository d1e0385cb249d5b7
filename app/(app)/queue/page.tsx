import type { Metadata } from "next";
import { QueueList } from "@/components/queue/queue-list";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getQueue, queueQuery } from "@/lib/server/queue/get-queue";

export const metadata: Metadata = { title: "My queue" };

export default async function QueuePage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("queue.view");
  // A link to one kind's page is kept in the URL; a malformed one shows the first page of everything.
  const query = queueQuery.safeParse(await searchParams);
  const initial = await getQueue(user, query.success ? query.data : {});
  return (
    <>
      <PageHeader
        title="My queue"
        description={`What is waiting for you, ${user.name.split(" ")[0]}.`}
      />
      <QueueList initial={initial} />
    </>
  );
}
