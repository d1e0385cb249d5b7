import { auditEventsQuery } from "@/lib/schemas/api";
import { listAuditEventsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "audit.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, auditEventsQuery);
  return q.ok ? ok(await listAuditEventsApi(q.data)) : q.response;
});
