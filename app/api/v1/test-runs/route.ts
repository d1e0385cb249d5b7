import { testRunsQuery } from "@/lib/schemas/api";
import { listTestRunsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "evidence.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, testRunsQuery);
  return q.ok ? ok(await listTestRunsApi(q.data)) : q.response;
});
