import { NextResponse } from "next/server";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { queryAuditEvents } from "@/lib/server/audit/query-audit-events";
import { authorize } from "@/lib/server/auth/current-user";

/** One page of the audit trail for the browser (keyset pagination, newest first). */
export async function GET(request: Request) {
  const auth = await authorize("audit.view");
  if (!auth.ok) return jsonError(auth.status, auth.message);
  const parsed = auditQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success) return jsonError(400, "Some filters are not valid.", zodFieldErrors(parsed.error));
  return NextResponse.json(await queryAuditEvents(parsed.data), { headers: { "Cache-Control": "no-store" } });
}
