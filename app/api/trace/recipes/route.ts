import { NextResponse } from "next/server";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { traceRecipesQuerySchema } from "@/lib/schemas/trace";
import { defineRoute } from "@/lib/server/api/handler";
import { listTraceScopes } from "@/lib/server/trace/parameter-history";

/** The recipe chooser's options once a cleaning system is chosen. */
export const GET = defineRoute({ permission: "trace.view" }, async ({ request }) => {
  const parsed = traceRecipesQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success)
    return jsonError(400, "Choose a cleaning system from the list.", zodFieldErrors(parsed.error));
  const { recipes } = await listTraceScopes(parsed.data.system);
  return NextResponse.json({ recipes }, { headers: { "Cache-Control": "no-store" } });
});
