/**
 * The plant overview at plant size: seeds the generated Fennmoor plant (tests/bench/seed-plant.ts)
 * into a fresh SQLite file, then times loadPlantOverview cold and warm and prints the query plan
 * of the runs read.
 *
 *   npx tsx tests/bench/overview.ts [--scale=ci] [--db=/tmp/plant.db] [--reuse [--read-only]]
 */
import "../../scripts/server-modules-outside-next";
import { existsSync } from "node:fs";
import { resolve } from "node:path";
import { sql } from "drizzle-orm";
import { openDatabase, setProcessDatabase } from "@/db/client";
import { scaleFromArgs } from "./plant-scale";
import { seedPlant } from "./seed-plant";

const args = process.argv.slice(2);
const scale = scaleFromArgs(args, process.env);
const dbPath = resolve(
  args.find((a) => a.startsWith("--db="))?.slice(5) ?? "data/bench/overview.db",
);
const log = (s: string) => console.log(s);

if (!(args.includes("--reuse") && existsSync(dbPath))) {
  const t = performance.now();
  await seedPlant(scale, dbPath, 0, log);
  log(`seeded ${scale.name} plant in ${((performance.now() - t) / 1000).toFixed(1)} s`);
}
const { db, client } = openDatabase(`file:${dbPath}`);
setProcessDatabase(db, client);
// A database still being written by another process is read as it is (no ANALYZE: that writes).
if (!args.includes("--read-only")) await db.run(sql`ANALYZE`);
const { latestRunsQuery, loadPlantOverview, RUNS_PER_COMBINATION } =
  await import("@/lib/server/overview/load-overview");
const counts = await db.all<{ runs: number; events: number; combos: number }>(sql`
  select (select count(*) from test_runs) as runs, (select count(*) from audit_events) as events,
         (select count(*) from requalification_intervals) as combos`);
log(
  `runs ${counts[0].runs}, audit events ${counts[0].events}, qualified combinations ${counts[0].combos}`,
);
const times: number[] = [];
let pages = 1;
for (let i = 0; i < 6; i++) {
  const t = performance.now();
  const o = await loadPlantOverview({ page: 1 + (i % 2) });
  times.push(performance.now() - t);
  pages = o.pages;
  if (i === 0)
    log(
      `page 1: ${o.washers.length} washers, ${o.washers.reduce((n, w) => n + w.families.length, 0)} part family rows, ${o.overdue.length} overdue rows, ${o.summary.openChanges} open changes`,
    );
}
log(
  `loadPlantOverview ms: ${times.map((t) => t.toFixed(0)).join(", ")} (first is cold); ${pages} pages`,
);
const pairs = await db.all<{ systemId: string; familyId: string }>(sql`
  select distinct rc.system_id as systemId, ri.part_family_id as familyId
  from requalification_intervals ri join recipe_versions v on v.id = ri.recipe_version_id
  join recipes rc on rc.id = v.recipe_id where v.status = 'effective' limit 12`);
const plan = await db.all<{ detail: string }>(
  sql`EXPLAIN QUERY PLAN ${latestRunsQuery(pairs, RUNS_PER_COMBINATION)}`,
);
log([...new Set(plan.map((p) => p.detail))].join("\n"));
process.exit(0);
