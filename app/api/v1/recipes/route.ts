import { recipesQuery } from "@/lib/schemas/api";
import { listRecipesApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseQuery } from "@/lib/server/api/handler";

export const GET = apiRoute({ permission: "systems.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, recipesQuery);
  return q.ok ? ok(await listRecipesApi(q.data)) : q.response;
});
