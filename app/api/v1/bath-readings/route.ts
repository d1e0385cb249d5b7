import { bathReadingOut } from "@/lib/schemas/api";
import { bathRecordSchema } from "@/lib/schemas/evidence";
import { apiRoute, ok, parseBody } from "@/lib/server/api/handler";
import { recordBathEntry } from "@/lib/server/bath/record-bath-entry";

/**
 * A bath reading (or any bath-log entry) from a dosing controller or a lab system, through the
 * same service as the tank page: graded against the tank's plan and flagged beyond a reject limit.
 */
export const POST = apiRoute(
  { permission: "bath.record", scope: "read_write" },
  async ({ request, user }) => {
    const body = await parseBody(request, bathRecordSchema);
    if (!body.ok) return body.response;
    const row = await recordBathEntry(user.actor, body.data);
    return ok(
      bathReadingOut.parse({
        id: row.id,
        stageId: row.stageId,
        kind: row.kind,
        performedAt: row.performedAt,
        concentrationPct: row.concentrationPct,
        limitState: row.limitState,
        findings: row.evaluation?.findings ?? [],
      }),
      201,
    );
  },
);
