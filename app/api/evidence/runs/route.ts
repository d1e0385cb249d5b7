import { NextResponse } from "next/server";
import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";
import { defineRoute } from "@/lib/server/api/handler";
import { listRunsPage } from "@/lib/server/evidence/queries";

/** One page of the evidence table, filtered and sorted on the server. */
export const GET = defineRoute({ permission: "evidence.view" }, async ({ request }) => {
  const parsed = evidenceListQuerySchema.safeParse(
    Object.fromEntries(request.nextUrl.searchParams),
  );
  if (!parsed.success)
    return NextResponse.json(
      { error: parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join(" ") },
      { status: 400 },
    );
  return NextResponse.json(await listRunsPage(parsed.data), {
    headers: { "Cache-Control": "no-store" },
  });
});
