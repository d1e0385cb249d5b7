import "server-only";
import { and, desc, eq, gte, inArray, lt, lte, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { humanize } from "@/lib/format/labels";
import { auditEvents } from "@/db/schema";
import { describeChanges, referencedRecords } from "@/lib/audit/describe";
import { currentEventType, readAuditEvent, storedNamesOf } from "@/lib/audit/read";
import type { AuditQuery } from "@/lib/schemas/audit";
import { labelRecords } from "./record-labels";

/** The filters as SQL, shared by the browser, the CSV export and the API. */
export function auditConditions(q: Partial<AuditQuery>): SQL | undefined {
  const where: SQL[] = [];
  if (q.actor)
    where.push(
      q.actor === "system" ? eq(auditEvents.actorName, "system") : eq(auditEvents.actorId, q.actor),
    );
  if (q.recordType) where.push(eq(auditEvents.recordType, q.recordType));
  if (q.recordId) where.push(eq(auditEvents.recordId, q.recordId));
  if (q.eventType) where.push(inArray(auditEvents.action, storedNamesOf(q.eventType)));
  if (q.from) where.push(gte(auditEvents.at, `${q.from}T00:00:00.000Z`));
  if (q.to) where.push(lte(auditEvents.at, `${q.to}T23:59:59.999Z`));
  return where.length ? and(...where) : undefined;
}

/** One page of events, newest first, with the cursor for the next (older) page. */
export async function queryAuditEvents(q: AuditQuery) {
  const where = auditConditions(q);
  const rows = await getDb()
    .select()
    .from(auditEvents)
    .where(q.before ? and(where, lt(auditEvents.seq, q.before)) : where)
    .orderBy(desc(auditEvents.seq))
    .limit(q.limit + 1);
  const page = rows.slice(0, q.limit);
  const events = page.map((r) => ({ row: r, event: readAuditEvent(r) }));
  // Records are shown by their numbers and names, looked up for the whole page at once.
  const labelOf = await labelRecords(
    events.flatMap(({ row, event }) => [
      { recordType: row.recordType, recordId: row.recordId },
      ...referencedRecords(event),
    ]),
  );
  return {
    items: events.map(({ row: r, event }) => ({
      seq: r.seq,
      at: r.at,
      actorName: r.actorName,
      eventType: event.eventType,
      storedAs: event.storedAs,
      recordType: r.recordType,
      recordTypeLabel: humanize(r.recordType),
      recordId: r.recordId,
      recordLabel: labelOf(r.recordType, r.recordId) ?? null,
      reason: r.reason,
      changes: describeChanges(event, labelOf),
      hash: r.hash,
    })),
    nextBefore: rows.length > q.limit ? page[page.length - 1].seq : null,
  };
}

export type AuditPage = Awaited<ReturnType<typeof queryAuditEvents>>;

/** Every matching event for export, newest first, in pages so memory stays flat. */
export async function* iterateAuditEvents(
  q: Partial<Omit<AuditQuery, "before" | "limit">>,
  pageSize = 2000,
) {
  let before: number | undefined;
  for (;;) {
    const where = auditConditions(q);
    const rows = await getDb()
      .select()
      .from(auditEvents)
      .where(before ? and(where, lt(auditEvents.seq, before)) : where)
      .orderBy(desc(auditEvents.seq))
      .limit(pageSize);
    if (rows.length === 0) return;
    yield rows;
    before = rows[rows.length - 1].seq;
  }
}

/** The distinct values the filters offer; an event type stored under an earlier name is offered once, by today's. */
export async function auditFilterOptions() {
  const db = getDb();
  const stored = await db.selectDistinct({ v: auditEvents.action }).from(auditEvents);
  const types = await db
    .selectDistinct({ v: auditEvents.recordType })
    .from(auditEvents)
    .orderBy(auditEvents.recordType);
  const eventTypes = [...new Set(stored.map((a) => currentEventType(a.v)))].sort();
  return { eventTypes, recordTypes: types.map((t) => t.v) };
}
