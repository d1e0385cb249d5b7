import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq, sql, type SQL } from "drizzle-orm";
import { seedDemo } from "@/db/seed";
import { users } from "@/db/schema";
import { runQueueQueries, VERIFY_KIND } from "@/lib/server/evidence/queue-provider";
import { openChangeIds } from "@/lib/server/changes/queue-provider";
import { documentQueueQueries } from "@/lib/server/documents/queue-provider";
import { beyondLimitReadings } from "@/lib/server/bath/limits-queue-provider";
import { getQueue, QUEUE_PAGE_SIZE } from "@/lib/server/queue/get-queue";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let engineer: { id: string; name: string };
const RUNS = 6000;
const DOCUMENTS = 3000;
const PERFORMED_EVERY = 40; // 150 performed runs among 6,000: waiting runs are a sliver, as in a plant.

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  [engineer] = await t.db
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.email, "engineer@fennmoor.example"));
  // Thousands of settled runs copied from a demo run; every 40th is performed and waits for a second person.
  await t.client.execute(`
    insert into test_runs (id, number, part_family_id, recipe_version_id, test_type, status, outcome, revision, technician_id, lab, performed_on, created_by, created_at)
    select 'plan-' || n, 'QP-' || printf('%06d', n), r.part_family_id, r.recipe_version_id, r.test_type,
           case when n % ${PERFORMED_EVERY} = 0 then 'performed' else 'verified' end, 'pass', 1, r.technician_id, r.lab, r.performed_on, r.created_by, r.created_at
    from (with recursive seq(n) as (select 1 union all select n + 1 from seq where n < ${RUNS}) select n from seq),
         (select * from test_runs limit 1) r`);
  // A library of thousands of effective documents, as a plant holds, owned by the engineer: the
  // drafts and versions in review are the sliver the queue looks for.
  await t.client.execute(`
    insert into documents (id, number, title, type, owner_id, created_at)
    select 'plan-doc-' || n, 'QP-DOC-' || printf('%06d', n), 'Library document ' || n, d.type, '${engineer.id}', d.created_at
    from (with recursive seq(n) as (select 1 union all select n + 1 from seq where n < ${DOCUMENTS}) select n from seq),
         (select * from documents limit 1) d`);
  await t.client.execute(`
    insert into document_versions (id, document_id, version, status, content, created_by, created_at)
    select 'plan-ver-' || substr(d.id, 10), d.id, 1, 'effective', v.content, v.created_by, v.created_at
    from documents d, (select * from document_versions limit 1) v where d.id like 'plan-doc-%'`);
  // Each library version was approved once: thousands of decided review steps, a few still open.
  await t.client.execute(`
    insert into document_reviews (id, version_id, round, step, role, assignee_id, activated_at, decision, decided_at, created_at)
    select 'plan-rev-' || substr(v.id, 10), v.id, 1, 1, 'approver', '${engineer.id}', v.created_at, 'approved', v.created_at, v.created_at
    from document_versions v where v.id like 'plan-ver-%'`);
  // Years of bath log, every reading within its limits: the readings beyond one are the sliver.
  await t.client.execute(`
    insert into bath_records (id, stage_id, kind, performed_at, recorded_by, created_at)
    select 'plan-bath-' || n, b.stage_id, b.kind, strftime('%Y-%m-%dT%H:%M:%fZ', '2020-01-01', '+' || n || ' hours'), b.recorded_by, b.created_at
    from (with recursive seq(n) as (select 1 union all select n + 1 from seq where n < 5000) select n from seq),
         (select * from bath_records limit 1) b`);
  await t.client.execute("ANALYZE");
});
afterAll(() => t.cleanup());

async function plan(query: SQL) {
  const rows = await t.db.all<{ detail: string }>(sql`EXPLAIN QUERY PLAN ${query}`);
  return rows.map((r) => r.detail).join("\n");
}

describe("My queue at plant shape", () => {
  it("reads runs waiting to be performed or verified through the status index, never a scan of every run", async () => {
    const q = runQueueQueries(engineer.id, { offset: 0, limit: QUEUE_PAGE_SIZE });
    for (const query of [q.perform, q.performCount, q.verify, q.verifyCount]) {
      const detail = await plan(query);
      expect(detail).toMatch(/SEARCH r USING (COVERING )?INDEX test_runs_status_idx \(status=\?\)/);
      expect(detail).not.toMatch(/SCAN r\b/);
    }
  });

  it("reads open change requests through the status index", async () => {
    const detail = await plan(sql`select id from change_requests where id in ${openChangeIds}`);
    expect(detail).toMatch(
      /SEARCH change_requests USING (COVERING )?INDEX change_requests_status_idx \(status=\?\)/,
    );
  });

  it("finds the engineer's drafts and the reviews waiting on them through indexes, never a scan of every document version", async () => {
    const q = documentQueueQueries(engineer.id);
    const returned = await plan(q.returned.getSQL());
    expect(returned).toMatch(
      /SEARCH (document_versions|v) USING (COVERING )?INDEX document_versions_status_idx \(status=\?\)/,
    );
    expect(returned).not.toMatch(/SCAN (document_versions|documents)\b/);
    const steps = await plan(q.steps.getSQL());
    expect(steps).toMatch(/SEARCH document_reviews USING INDEX document_reviews_assignee_idx/);
    expect(steps).not.toMatch(/SCAN /);
  });

  it("finds tank readings beyond a limit through their partial index, never a scan of the bath log", async () => {
    const detail = await plan(beyondLimitReadings().getSQL());
    expect(detail).toMatch(/USING (COVERING )?INDEX bath_records_beyond_limit_idx/);
    // Walking the partial index reads only the readings beyond a limit; any other walk reads the log.
    expect(detail).not.toMatch(
      /SCAN bath_records(?! USING (COVERING )?INDEX bath_records_beyond_limit_idx)/,
    );
  });

  it("pages one kind at a time and counts every kind in full", async () => {
    const user = {
      ...engineer,
      email: "",
      roles: ["engineer"],
      mustChangePassword: false,
      sessionId: "s",
    } as never;
    const first = await getQueue(user);
    const verify = first.kinds.find((k) => k.kind === VERIFY_KIND)!;
    expect(verify.total).toBeGreaterThanOrEqual(RUNS / PERFORMED_EVERY);
    expect(first.items.filter((i) => i.kind === VERIFY_KIND)).toHaveLength(QUEUE_PAGE_SIZE);
    // Walking every page of the kind returns each waiting run exactly once.
    const seen: string[] = [];
    for (let page = 1; (page - 1) * QUEUE_PAGE_SIZE < verify.total; page++) {
      const p = await getQueue(user, { kind: VERIFY_KIND, page });
      expect(p.items.every((i) => i.kind === VERIFY_KIND)).toBe(true);
      seen.push(...p.items.map((i) => i.id));
    }
    expect(seen).toHaveLength(verify.total);
    expect(new Set(seen).size).toBe(verify.total);
  });
});
