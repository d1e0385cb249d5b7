"use client";

import { useQuery } from "@tanstack/react-query";
import { AlarmClock, CalendarClock } from "lucide-react";
import Link from "next/link";
import type { QueueEntry } from "@/lib/server/queue/get-queue";
import { EmptyState } from "@/components/ui/empty-state";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

async function fetchQueue(): Promise<QueueEntry[]> {
  const response = await fetch("/api/queue", { cache: "no-store" });
  if (!response.ok) throw new Error((await response.json().catch(() => null))?.error ?? "The queue could not be loaded.");
  return (await response.json()).items;
}

/** Fetched in the client and refreshed every 30 s and whenever the tab regains focus. */
export function QueueList({ initial }: { initial: QueueEntry[] }) {
  const { data, error, isFetching } = useQuery({
    queryKey: ["queue"],
    queryFn: fetchQueue,
    initialData: initial,
    refetchInterval: 30_000,
    refetchOnWindowFocus: true,
  });
  if (error) return <p role="alert" className="text-sm text-red-800">{error.message}</p>;
  if (data.length === 0) {
    return (
      <EmptyState title="Nothing is waiting for you">
        Reviews and approvals assigned to you, drafts sent back to you, tests to perform or verify, and bath
        maintenance that falls due appear here as they arise.
      </EmptyState>
    );
  }
  return (
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
              <Link href={item.href} className="font-medium text-brand-800 hover:underline">
                {item.title}
              </Link>
              <span className="block text-xs text-stone-600">{item.detail}</span>
            </Td>
            <Td className="whitespace-nowrap">
              {item.due === null ? (
                "—"
              ) : item.overdue ? (
                <span className="inline-flex items-center gap-1 font-medium text-red-800">
                  <AlarmClock className="h-4 w-4" aria-hidden="true" /> Overdue since {formatDate(item.due)}
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
  );
}
