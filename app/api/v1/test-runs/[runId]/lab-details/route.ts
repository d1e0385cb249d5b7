import { z } from "zod";
import { labDetailsSchema } from "@/lib/schemas/lab-details";
import { apiRoute, notFound, ok, parseBody } from "@/lib/server/api/handler";
import { getTestRunApi } from "@/lib/server/api/queries";
import { saveLabDetails } from "@/lib/server/lab-report/save-lab-details";

/**
 * How the run was extracted and analysed and on which parts, from a LIMS: the same schema and
 * service as the run page's form, audited under the token's owner.
 */
export const POST = apiRoute<{ runId: string }>(
  { permission: "evidence.record", scope: "read_write" },
  async ({ request, user, params }) => {
    if (!z.uuid().safeParse(params.runId).success) return notFound("test run");
    const body = await parseBody(request, labDetailsSchema);
    if (!body.ok) return body.response;
    await saveLabDetails(user.actor, {
      runId: params.runId,
      details: body.data,
    });
    const run = await getTestRunApi(params.runId);
    return run ? ok(run) : notFound("test run");
  },
);
