import { pageQuery } from "@/lib/schemas/api";
import { listSystemsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "systems.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, pageQuery);
  return q.ok ? ok(await listSystemsApi(q.data)) : q.response;
});
