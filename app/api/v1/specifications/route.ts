import { specificationsQuery } from "@/lib/schemas/api";
import { listSpecificationsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "parts.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, specificationsQuery);
  return q.ok ? ok(await listSpecificationsApi(q.data)) : q.response;
});
