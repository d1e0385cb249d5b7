import { partFamiliesQuery } from "@/lib/schemas/api";
import { listPartFamiliesApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "parts.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, partFamiliesQuery);
  return q.ok ? ok(await listPartFamiliesApi(q.data)) : q.response;
});
