import { NextResponse } from "next/server";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { parameterSearchQuerySchema } from "@/lib/schemas/trace";
import { defineRoute } from "@/lib/server/api/handler";
import { searchTraceableParameters } from "@/lib/server/trace/parameter-history";

/** The trace page's search as the user types: the first matches and how many there are. */
export const GET = defineRoute({ permission: "trace.view" }, async ({ request }) => {
  const parsed = parameterSearchQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success)
    return jsonError(400, "Some search values are not valid.", zodFieldErrors(parsed.error));
  const { system, recipe, q } = parsed.data;
  const scope = { systemId: system || undefined, recipeId: recipe || undefined };
  const result = await searchTraceableParameters({ ...scope, q });
  return NextResponse.json(result, { headers: { "Cache-Control": "no-store" } });
});
