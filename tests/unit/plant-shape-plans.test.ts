import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql, type SQL } from "drizzle-orm";
import { seedDemo } from "@/db/seed";
import {
  latestRunsQuery,
  loadPlantOverview,
  RUNS_PER_COMBINATION,
} from "@/lib/server/overview/load-overview";
import { runsNamingCycles } from "@/lib/server/cycles/lot-history";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const RUNS = 6000;

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  // Thousands of verified particle runs copied, samples and all, from a demo run, dated after the
  // demo's own. Their samples name no wash cycle, as most validation samples do not.
  const [{ id }] = await t.db.all<{ id: string }>(
    sql`select id from test_runs where status = 'verified' and test_type = 'particle_cleanliness' order by performed_on desc limit 1`,
  );
  const source = `(select * from test_runs where id = '${id}')`;
  await t.client.execute(`
    insert into test_runs (id, number, part_family_id, recipe_version_id, test_type, status, outcome, revision, technician_id, lab, performed_on, created_by, created_at)
    select 'plan-' || n, 'QP-' || printf('%06d', n), r.part_family_id, r.recipe_version_id, r.test_type,
           'verified', 'pass', 1, r.technician_id, r.lab, date('2026-03-01', '+' || (n % 200) || ' days'), r.created_by, r.created_at
    from (with recursive seq(n) as (select 1 union all select n + 1 from seq where n < ${RUNS}) select n from seq),
         ${source} r`);
  await t.client.execute(`
    insert into test_samples (id, run_id, sample_label, worst_case, data, created_at)
    select c.id || '-' || s.id, c.id, s.sample_label, s.worst_case, s.data, s.created_at
    from test_runs c, ${source} r join test_samples s on s.run_id = r.id
    where c.id like 'plan-%'`);
  await t.client.execute("ANALYZE");
}, 120_000);
afterAll(() => t.cleanup());

async function plan(query: SQL) {
  const rows = await t.db.all<{ detail: string }>(sql`EXPLAIN QUERY PLAN ${query}`);
  return rows.map((r) => r.detail).join("\n");
}

describe("plant overview at plant shape", () => {
  it("reads each washer × part family's newest verified runs through the family-status index, never a scan of every run", async () => {
    const pairs = await t.db.all<{ systemId: string; familyId: string }>(sql`
      select distinct rc.system_id as systemId, ri.part_family_id as familyId
      from requalification_intervals ri join recipe_versions v on v.id = ri.recipe_version_id
      join recipes rc on rc.id = v.recipe_id`);
    expect(pairs.length).toBeGreaterThan(1);
    const detail = await plan(latestRunsQuery(pairs, RUNS_PER_COMBINATION));
    expect(detail).toMatch(
      /SEARCH r USING INDEX test_runs_family_status_idx \(part_family_id=\? AND status=\?/,
    );
    expect(detail).not.toMatch(/SCAN r\b/);
  });

  it("bounds the runs per washer × part family and names every washer's state in words", async () => {
    const overview = await loadPlantOverview({ now: new Date("2026-12-01T08:00:00Z") });
    expect(overview.washers.map((w) => w.code)).toEqual(["AW-3", "SC-1"]);
    for (const w of overview.washers) {
      expect(["action", "attention", "in_order"]).toContain(w.state.state);
      if (w.state.state !== "in_order") expect(w.state.reasons.length).toBeGreaterThan(0);
      for (const f of w.families)
        expect(f.trend?.points.length ?? 0).toBeLessThanOrEqual(RUNS_PER_COMBINATION);
    }
    // The copied runs are the newest particle results of their family: the trend reads them, bounded.
    const withCopies = overview.washers
      .flatMap((w) => w.families)
      .find((f) => f.trend?.points.length === RUNS_PER_COMBINATION);
    expect(withCopies).toBeDefined();
  });
});

describe("lot history at plant shape", () => {
  beforeAll(async () => {
    // A plant whose samples name no wash cycle yet: a full index's statistics then said one cycle
    // id matched every sample, and the planner walked every run instead (0.8 s at 200,000 runs).
    await t.client.execute("update test_samples set cycle_number = null");
    await t.client.execute("ANALYZE");
  });

  it("finds the runs whose samples name a lot's cycles through the cycle index, never a scan of every run", async () => {
    const detail = await plan(runsNamingCycles(t.db, ["C-0001", "C-0002"]).getSQL());
    expect(detail).toMatch(
      /SEARCH test_samples USING INDEX test_samples_cycle_idx \(cycle_number=\?\)/,
    );
    expect(detail).not.toMatch(/SCAN test_runs\b/);
  });
});
