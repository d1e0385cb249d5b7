import { getDb } from "@/db/client";
import { appendAudit } from "@/lib/audit";
import { toCsv } from "@/lib/csv/to-csv";
import { jsonError, searchParamsObject, zodFieldErrors } from "@/lib/http/json";
import { auditQuerySchema } from "@/lib/schemas/audit";
import { iterateAuditEvents } from "@/lib/server/audit/query-audit-events";
import { todayUtc } from "@/lib/format/date";
import { defineRoute } from "@/lib/server/api/handler";

// The stored columns by their own names: a row here is what its hash covers.
const HEADER = [
  "seq",
  "at_utc",
  "actor",
  "action",
  "record_type",
  "record_id",
  "old_value",
  "new_value",
  "reason",
  "prev_hash",
  "hash",
];

/** The filtered audit trail as CSV; the export itself is audited. */
export const GET = defineRoute({ permission: "audit.export" }, async ({ request, user }) => {
  const parsed = auditQuerySchema.safeParse(searchParamsObject(request.url));
  if (!parsed.success)
    return jsonError(400, "Some filters are not valid.", zodFieldErrors(parsed.error));
  const { before: _before, limit: _limit, ...filters } = parsed.data;
  const given = Object.fromEntries(
    Object.entries(filters).filter((e): e is [string, string] => e[1] !== undefined),
  );

  const encoder = new TextEncoder();
  const events = iterateAuditEvents(filters);
  let first = true;
  const body = new ReadableStream<Uint8Array>({
    async pull(controller) {
      const next = await events.next();
      if (next.done) {
        if (first) controller.enqueue(encoder.encode(toCsv(HEADER, []) + "\r\n"));
        controller.close();
        return;
      }
      const rows = next.value.map((e) => [
        e.seq,
        e.at,
        e.actorName,
        e.action,
        e.recordType,
        e.recordId,
        e.oldValue,
        e.newValue,
        e.reason,
        e.prevHash,
        e.hash,
      ]);
      const csv = toCsv(HEADER, rows);
      // The header goes out once, with the first page.
      controller.enqueue(
        encoder.encode((first ? csv : csv.slice(csv.indexOf("\r\n") + 2)) + "\r\n"),
      );
      first = false;
    },
  });
  await getDb().transaction((tx) =>
    appendAudit(
      tx,
      { id: user.id, name: user.name },
      {
        eventType: "audit.exported",
        recordType: "audit_trail",
        recordId: "csv",
        new: { filters: given },
      },
    ),
  );
  const stamp = todayUtc();
  return new Response(body, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="washproof-audit-trail-${stamp}.csv"`,
      "Cache-Control": "no-store",
    },
  });
});
