import { NextResponse, type NextRequest } from "next/server";
import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";
import { authorize } from "@/lib/server/auth/current-user";
import { listRunsPage } from "@/lib/server/evidence/queries";

/** One page of the evidence table, filtered and sorted on the server. */
export async function GET(request: NextRequest) {
  const auth = await authorize("evidence.view");
  if (!auth.ok) return NextResponse.json({ error: auth.message }, { status: auth.status });
  const parsed = evidenceListQuerySchema.safeParse(Object.fromEntries(request.nextUrl.searchParams));
  if (!parsed.success) return NextResponse.json({ error: parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join(" ") }, { status: 400 });
  return NextResponse.json(await listRunsPage(parsed.data), { headers: { "Cache-Control": "no-store" } });
}
