import { testRunsQuery } from "@/lib/schemas/api";
import { createRunSchema } from "@/lib/schemas/evidence";
import { getTestRunApi, listTestRunsApi } from "@/lib/server/api/queries";
import { apiRoute, ok, parseBody, parseQuery } from "@/lib/server/api/handler";
import { createRun } from "@/lib/server/evidence/create-run";

export const GET = apiRoute({ permission: "evidence.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, testRunsQuery);
  return q.ok ? ok(await listTestRunsApi(q.data)) : q.response;
});

/**
 * Opens a test run for an instrument or a lab system, through the same service as the
 * New test run form: the same checks (a qualified combination, or one a change request
 * or protocol is qualifying), the same numbering and the same audit event.
 */
export const POST = apiRoute(
  { permission: "evidence.record", scope: "read_write" },
  async ({ request, user }) => {
    const body = await parseBody(request, createRunSchema);
    if (!body.ok) return body.response;
    const run = await createRun(user.actor, body.data);
    return ok(await getTestRunApi(run.id), 201);
  },
);
