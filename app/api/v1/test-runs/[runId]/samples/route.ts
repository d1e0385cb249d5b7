import { z } from "zod";
import { getDb } from "@/db/client";
import { unknownFieldErrors, unknownFieldsMessage } from "@/lib/api/strict-keys";
import { jsonError, zodFieldErrors } from "@/lib/http/json";
import { SAMPLE_SCHEMAS } from "@/lib/schemas/evidence";
import { apiRoute, notFound, ok, parseBody } from "@/lib/server/api/handler";
import { getTestRunApi } from "@/lib/server/api/queries";
import { addSample } from "@/lib/server/evidence/add-sample";
import { getRunRow } from "@/lib/server/evidence/run-content";

/**
 * One sample's raw data from a lab instrument, through the same service as the
 * entry form: the run's test type picks the schema, the outcome is recomputed
 * from the stored rows, and the addition is audited under the token's owner, naming the token.
 */
export const POST = apiRoute<{ runId: string }>(
  { permission: "evidence.record", scope: "read_write" },
  async ({ request, user, params }) => {
    if (!z.uuid().safeParse(params.runId).success) return notFound("test run");
    const run = await getRunRow(getDb(), params.runId);
    if (!run) return notFound("test run");
    const schema = SAMPLE_SCHEMAS[run.testType];
    const body = await parseBody(request, z.unknown());
    if (!body.ok) return body.response;
    const extra = unknownFieldErrors(schema, body.data);
    if (extra) return jsonError(422, unknownFieldsMessage(extra), extra);
    const parsed = schema.safeParse(body.data);
    if (!parsed.success)
      return jsonError(422, "Some fields are not valid.", zodFieldErrors(parsed.error));
    const row = await addSample(user.actor, { runId: run.id, sample: parsed.data });
    return ok({ sampleId: row.id, run: await getTestRunApi(run.id) }, 201);
  },
);
