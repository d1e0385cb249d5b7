import { NextResponse } from "next/server";
import { authorize } from "@/lib/server/auth/current-user";
import { getQueue } from "@/lib/server/queue/get-queue";

/** The signed-in user's queue, polled by the My queue page. */
export async function GET() {
  const auth = await authorize("queue.view");
  if (!auth.ok) return NextResponse.json({ error: auth.message }, { status: auth.status });
  const items = await getQueue(auth.user);
  return NextResponse.json({ items }, { headers: { "Cache-Control": "no-store" } });
}
