import { cycleBatchSchema, cyclesQuery } from "@/lib/schemas/cycle";
import { apiRoute, ok, parseBody, parseQuery } from "@/lib/server/api/handler";
import { listCyclesApi } from "@/lib/server/cycles/queries";
import { recordCycles } from "@/lib/server/cycles/record-cycles-now";

/** Wash cycles, newest first: by washer, lot or flag. */
export const GET = apiRoute({ permission: "evidence.view", scope: "read" }, async ({ request }) => {
  const q = parseQuery(request, cyclesQuery);
  return q.ok ? ok(await listCyclesApi(q.data)) : q.response;
});

/**
 * A washer's feed: one cycle, or `{ cycles: [...] }` up to 1,000, through the same service as the form
 * and the CSV import; all are recorded or none, each refusal named by its place and field.
 */
export const POST = apiRoute(
  { permission: "evidence.record", scope: "read_write" },
  async ({ request, user }) => {
    const body = await parseBody(request, cycleBatchSchema);
    if (!body.ok) return body.response;
    const cycles = "cycles" in body.data ? body.data.cycles : [body.data];
    const result = await recordCycles(user.actor, { source: "api", cycles });
    return ok(
      {
        batchId: result.batchId,
        recorded: result.recorded,
        cycles: result.cycles.map((c) => ({
          id: c.id,
          cycleNumber: c.cycleNumber,
          flagged: c.flagged,
          reasons: result.flagged.find((f) => f.id === c.id)?.reasons ?? [],
        })),
      },
      201,
    );
  },
);
