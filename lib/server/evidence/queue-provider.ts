import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { partFamilies, signatures } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { humanize } from "@/lib/format/labels";
import type { QueueProvider, QueueWindow } from "@/lib/server/queue/types";

export const PERFORM_KIND = "Perform test";
export const VERIFY_KIND = "Verify test";

/**
 * Open and performed runs are a sliver of the plant's runs, but without per-value statistics
 * (no STAT4 in libSQL) the planner believes each status holds a third of them and walks every
 * run instead. Naming the status index keeps both queue reads to the waiting runs alone.
 */
const waitingRuns = sql`test_runs r INDEXED BY test_runs_status_idx`;

/** Open runs the user is to perform: assigned to them or created by them. */
export function toPerform(userId: string): SQL {
  return sql`r.status = 'open' and (r.technician_id = ${userId} or r.created_by = ${userId})`;
}

/** Performed runs the user did not sign: a second person verifies. */
export function toVerify(userId: string): SQL {
  return sql`r.status = 'performed' and not exists (select 1 from ${signatures} s where s.record_type = 'test_run' and s.record_id = r.id and s.user_id = ${userId})`;
}

interface WaitingRun {
  id: string;
  number: string;
  revision: number;
  test_type: string;
  lab: string | null;
  performed_on: string | null;
  family: string;
}

/**
 * The queue's two run reads, as SQL (drizzle's builder cannot name an index), exported so a test
 * can read their query plans.
 */
export function runQueueQueries(userId: string, window: QueueWindow) {
  const page = (where: SQL, order: SQL) => sql`
    select r.id, r.number, r.revision, r.test_type, r.lab, r.performed_on, f.code as family
    from ${waitingRuns} join ${partFamilies} f on f.id = r.part_family_id
    where ${where} order by ${order} limit ${window.limit} offset ${window.offset}`;
  const total = (where: SQL) => sql`select count(*) as n from ${waitingRuns} where ${where}`;
  const perform = toPerform(userId);
  const verify = toVerify(userId);
  return {
    perform: page(perform, sql`r.performed_on is null, r.performed_on, r.number, r.revision`),
    performCount: total(perform),
    verify: page(verify, sql`r.number, r.revision`),
    verifyCount: total(verify),
  };
}

const FIRST_PAGE = (): QueueWindow => ({ offset: 0, limit: 50 });

/** Open runs assigned to the technician (to perform) and performed runs someone else signed (to verify), paged in the database. */
export const evidenceQueueProvider: QueueProvider = async (user, _now, window = FIRST_PAGE) => {
  const items = [];
  const totals: Record<string, number> = {};
  const db = getDb();
  const read = (query: SQL) => db.all<WaitingRun>(query);
  const countOf = async (query: SQL) => Number((await db.all<{ n: number }>(query))[0].n);
  const title = (run: WaitingRun) =>
    `${run.number}${run.revision > 1 ? ` rev ${run.revision}` : ""} · ${humanize(run.test_type)}`;
  if (can(user.roles, "evidence.record")) {
    const q = runQueueQueries(user.id, window(PERFORM_KIND));
    const [open, n] = await Promise.all([read(q.perform), countOf(q.performCount)]);
    totals[PERFORM_KIND] = n;
    items.push(
      ...open.map((run) => ({
        id: `perform:${run.id}`,
        kind: PERFORM_KIND,
        title: title(run),
        detail: `${run.family}, lab ${run.lab ?? "—"}; record the samples and sign as performed`,
        href: `/evidence/runs/${run.id}`,
        due: run.performed_on ? `${run.performed_on}T23:59:59.000Z` : null,
      })),
    );
  }
  if (can(user.roles, "evidence.verify")) {
    const q = runQueueQueries(user.id, window(VERIFY_KIND));
    const [performed, n] = await Promise.all([read(q.verify), countOf(q.verifyCount)]);
    totals[VERIFY_KIND] = n;
    items.push(
      ...performed.map((run) => ({
        id: `verify:${run.id}`,
        kind: VERIFY_KIND,
        title: title(run),
        detail: `${run.family}; performed, waiting for a second person's check`,
        href: `/evidence/runs/${run.id}`,
        due: null,
      })),
    );
  }
  return { items, totals };
};
