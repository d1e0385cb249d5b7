import { NextResponse } from "next/server";
import { defineRoute } from "@/lib/server/api/handler";
import { getQueue } from "@/lib/server/queue/get-queue";

/** The signed-in user's queue, polled by the My queue page. */
export const GET = defineRoute({ permission: "queue.view" }, async ({ user }) => {
  const items = await getQueue(user);
  return NextResponse.json({ items }, { headers: { "Cache-Control": "no-store" } });
});
