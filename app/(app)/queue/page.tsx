import type { Metadata } from "next";
import { QueueList } from "@/components/queue/queue-list";
import { PageHeader } from "@/components/ui/page-header";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getQueue } from "@/lib/server/queue/get-queue";

export const metadata: Metadata = { title: "My queue" };

export default async function QueuePage() {
  const user = await requirePageUser("queue.view");
  const { items: initial } = await getQueue(user);
  return (
    <>
      <PageHeader title="My queue" description={`What is waiting for you, ${user.name.split(" ")[0]}.`} />
      <QueueList initial={initial} />
    </>
  );
}
