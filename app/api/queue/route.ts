import { NextResponse } from "next/server";
import { defineRoute, parseQuery } from "@/lib/server/api/handler";
import { getQueue, queueQuery } from "@/lib/server/queue/get-queue";

/** The signed-in user's queue, polled by the My queue page: the first page of each kind, or `?kind=…&page=…`. */
export const GET = defineRoute({ permission: "queue.view" }, async ({ user, request }) => {
  const q = parseQuery(request, queueQuery);
  if (!q.ok) return q.response;
  return NextResponse.json(await getQueue(user, q.data), {
    headers: { "Cache-Control": "no-store" },
  });
});
