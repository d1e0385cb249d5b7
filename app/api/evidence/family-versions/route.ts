import { NextResponse } from "next/server";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { familyVersionsQuerySchema } from "@/lib/schemas/evidence-list";
import { defineRoute } from "@/lib/server/api/handler";
import { versionsUsedWith } from "@/lib/server/evidence/queries";

/** The new-run form's versions to list first once its part family is chosen. */
export const GET = defineRoute({ permission: "evidence.record" }, async ({ request }) => {
  const parsed = familyVersionsQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success)
    return jsonError(400, "Choose a part family from the list.", zodFieldErrors(parsed.error));
  const versionIds = await versionsUsedWith(parsed.data.partFamily);
  return NextResponse.json({ versionIds }, { headers: { "Cache-Control": "no-store" } });
});
