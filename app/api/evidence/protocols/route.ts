import { NextResponse } from "next/server";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { runProtocolsQuerySchema } from "@/lib/schemas/evidence-list";
import { defineRoute } from "@/lib/server/api/handler";
import { protocolsFor } from "@/lib/server/evidence/queries";

/** The new-run form's protocol choices once its part family and recipe version are chosen. */
export const GET = defineRoute({ permission: "evidence.record" }, async ({ request }) => {
  const parsed = runProtocolsQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success)
    return jsonError(
      400,
      "Choose a part family and a recipe version from the lists.",
      zodFieldErrors(parsed.error),
    );
  const protocols = await protocolsFor(parsed.data.partFamily, parsed.data.recipeVersion);
  return NextResponse.json({ protocols }, { headers: { "Cache-Control": "no-store" } });
});
