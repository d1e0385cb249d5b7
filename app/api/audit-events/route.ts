import { NextResponse } from "next/server";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { defineRoute } from "@/lib/server/api/handler";
import { queryAuditEvents } from "@/lib/server/audit/query-audit-events";

/** One page of the audit trail for the browser (keyset pagination, newest first). */
export const GET = defineRoute({ permission: "audit.view" }, async ({ request }) => {
  const parsed = auditQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success)
    return jsonError(400, "Some filters are not valid.", zodFieldErrors(parsed.error));
  return NextResponse.json(await queryAuditEvents(parsed.data), {
    headers: { "Cache-Control": "no-store" },
  });
});
