import { changeRequestsQuery } from "@/lib/schemas/api";
import { listChangeRequestsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "changes.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, changeRequestsQuery);
  return q.ok ? ok(await listChangeRequestsApi(q.data)) : q.response;
});
