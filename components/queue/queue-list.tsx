"use client";

import { useQuery } from "@tanstack/react-query";
import { AlarmClock, CalendarClock } from "lucide-react";
import { IntentLink } from "@/components/ui/intent-link";
import type { QueuePage } from "@/lib/server/queue/get-queue";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

function pageQuery(kind: string | null, page: number) {
  return kind === null ? "" : `?${new URLSearchParams({ kind, page: String(page) })}`;
}

async function fetchQueue(kind: string | null, page: number): Promise<QueuePage> {
  const response = await fetch(`/api/queue${pageQuery(kind, page)}`, { cache: "no-store" });
  if (!response.ok)
    throw new Error(
      (await response.json().catch(() => null))?.error ?? "The queue could not be loaded.",
    );
  return response.json();
}

/** Fetched in the client and refreshed every 30 s and whenever the tab regains focus; long kinds page in the URL. */
export function QueueList({ initial }: { initial: QueuePage }) {
  const {
    data: queue,
    error,
    isFetching,
  } = useQuery({
    queryKey: ["queue", initial.kind, initial.page],
    queryFn: () => fetchQueue(initial.kind, initial.page),
    initialData: initial,
    refetchInterval: 30_000,
    refetchOnWindowFocus: true,
  });
  if (error)
    return (
      <p role="alert" className="text-sm text-red-800">
        {error.message}
      </p>
    );
  const data = queue.items;
  if (data.length === 0 && queue.kind === null) {
    return (
      <EmptyState title="Nothing is waiting for you">
        Reviews and approvals assigned to you, drafts sent back to you, tests to perform or verify,
        and bath maintenance that falls due appear here as they arise.
      </EmptyState>
    );
  }
  return (
    <>
      <QueueScope queue={queue} />
      <Table caption="Waiting for you" busy={isFetching}>
        <THead>
          <Th>What</Th>
          <Th>Item</Th>
          <Th>Due</Th>
        </THead>
        <TBody>
          {data.map((item) => (
            <tr key={item.id}>
              <Td className="font-medium whitespace-nowrap">{item.kind}</Td>
              <Td>
                <IntentLink href={item.href} className="font-medium text-brand-800 hover:underline">
                  {item.title}
                </IntentLink>
                <span className="block text-xs text-stone-600">{item.detail}</span>
              </Td>
              <Td className="whitespace-nowrap">
                {item.due === null ? (
                  "—"
                ) : item.overdue ? (
                  <span className="inline-flex items-center gap-1 font-medium text-red-800">
                    <AlarmClock className="h-4 w-4" aria-hidden="true" /> Overdue since{" "}
                    {formatDate(item.due)}
                  </span>
                ) : (
                  <span className="inline-flex items-center gap-1">
                    <CalendarClock className="h-4 w-4" aria-hidden="true" /> {formatDate(item.due)}
                  </span>
                )}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      <QueuePager queue={queue} />
    </>
  );
}

/** Kinds with more waiting than one page shows, each with a link to its next page (the state lives in the URL). */
function QueuePager({ queue }: { queue: QueuePage }) {
  const shown = (kind: string) => queue.items.filter((i) => i.kind === kind).length;
  if (queue.kind !== null) {
    const total = queue.kinds.find((k) => k.kind === queue.kind)?.total ?? 0;
    const pages = Math.max(1, Math.ceil(total / queue.pageSize));
    return (
      <nav
        aria-label="Pages"
        className="mt-3 flex flex-wrap items-center gap-3 text-sm text-stone-700"
      >
        <span>
          {queue.kind}: page {queue.page} of {pages} ({total} waiting)
        </span>
        {queue.page > 1 && (
          <IntentLink
            className="text-brand-800 hover:underline"
            href={`/queue${pageQuery(queue.kind, queue.page - 1)}`}
          >
            Previous page
          </IntentLink>
        )}
        {queue.page < pages && (
          <IntentLink
            className="text-brand-800 hover:underline"
            href={`/queue${pageQuery(queue.kind, queue.page + 1)}`}
          >
            Next page
          </IntentLink>
        )}
        <IntentLink className="text-brand-800 hover:underline" href="/queue">
          Everything waiting
        </IntentLink>
      </nav>
    );
  }
  const longer = queue.kinds.filter((k) => k.total > shown(k.kind));
  if (longer.length === 0) return null;
  return (
    <ul
      id="more-waiting"
      aria-label="More waiting"
      className="mt-3 space-y-1 text-sm text-stone-700"
    >
      {longer.map((k) => (
        <li key={k.kind}>
          {k.kind}: {shown(k.kind)} of {k.total} shown.{" "}
          <IntentLink
            className="text-brand-800 hover:underline"
            href={`/queue${pageQuery(k.kind, 2)}`}
          >
            Next page of {k.kind.toLowerCase()}
          </IntentLink>
        </li>
      ))}
    </ul>
  );
}

/** Above the list, what it holds: one kind only, or the first page of each with more waiting below. */
function QueueScope({ queue }: { queue: QueuePage }) {
  const count = (n: number) => n.toLocaleString("en-GB");
  if (queue.kind !== null) {
    const total = queue.kinds.find((k) => k.kind === queue.kind)?.total ?? 0;
    return (
      <p className="mb-3 text-sm text-stone-700">
        Showing {queue.kind.toLowerCase()} only ({count(total)} waiting).{" "}
        <IntentLink className="text-brand-800 hover:underline" href="/queue">
          Everything waiting
        </IntentLink>
      </p>
    );
  }
  const shown = (kind: string) => queue.items.filter((i) => i.kind === kind).length;
  const longer = queue.kinds.filter((k) => k.total > shown(k.kind));
  if (longer.length === 0) return null;
  return (
    <p className="mb-3 text-sm text-stone-700">
      The first {queue.pageSize} of each kind are listed; more wait for{" "}
      {longer.map((k) => `${k.kind.toLowerCase()} (${count(k.total)})`).join(", ")}:{" "}
      <a className="text-brand-800 hover:underline" href="#more-waiting">
        their further pages
      </a>
      .
    </p>
  );
}
