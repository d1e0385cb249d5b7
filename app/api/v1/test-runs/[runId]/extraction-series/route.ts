import { z } from "zod";
import { particleRunDataApiSchema } from "@/lib/schemas/evidence";
import { apiRoute, notFound, ok, parseBody } from "@/lib/server/api/handler";
import { getTestRunApi } from "@/lib/server/api/queries";
import { saveRunData } from "@/lib/server/evidence/save-run-data";

/**
 * A particle run's extraction series and blank, through the same service as the run page's
 * form: the run must be open, the outcome is recomputed, and the change is audited under the
 * token's owner. Posting again replaces the series, as saving the form again does.
 */
export const POST = apiRoute<{ runId: string }>(
  { permission: "evidence.record", scope: "read_write" },
  async ({ request, user, params }) => {
    if (!z.uuid().safeParse(params.runId).success) return notFound("test run");
    const body = await parseBody(request, particleRunDataApiSchema);
    if (!body.ok) return body.response;
    await saveRunData(user.actor, { runId: params.runId, data: body.data });
    return ok(await getTestRunApi(params.runId));
  },
);
