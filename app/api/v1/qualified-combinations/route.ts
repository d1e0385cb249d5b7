import { qualifiedCombinationsQuery } from "@/lib/schemas/api";
import { listQualifiedCombinationsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "parts.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, qualifiedCombinationsQuery);
  return q.ok ? ok(await listQualifiedCombinationsApi(q.data)) : q.response;
});
