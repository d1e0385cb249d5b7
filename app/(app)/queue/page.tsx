import type { Metadata } from "next";
import { redirect } from "next/navigation";
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
  // An address past a kind's last page, or naming a kind with nothing waiting, moves to what exists.
  if (initial.kind !== null) {
    const total = initial.kinds.find((k) => k.kind === initial.kind)?.total ?? 0;
    const pages = Math.ceil(total / initial.pageSize);
    if (total === 0) redirect("/queue");
    if (initial.page > pages)
      redirect(`/queue?${new URLSearchParams({ kind: initial.kind, page: String(pages) })}`);
  }
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
