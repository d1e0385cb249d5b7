/**
 * Wash cycles at plant size: a washer log of `count` cycles recorded through the cycle service in one
 * call (all or none, as the import screen and the API record them), then lot histories answered from
 * the full table, with the query plan of the lot lookup checked for its index.
 *
 * Called by the plant benchmark (tests/bench/plant.ts) on the seeded plant before the server starts.
 * On its own, on a fresh migrated demo database:
 *
 *   npx tsx tests/bench/cycles.ts [--cycles=100000]
 */
import "../../scripts/server-modules-outside-next";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq, inArray, sql } from "drizzle-orm";
import { openDatabase, setProcessDatabase, type Database } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import {
  cleaningSystems,
  partFamilies,
  recipeParameters,
  recipes,
  recipeVersions,
  requalificationIntervals,
  userRoles,
  users,
} from "@/db/schema";
import { isCycleValue } from "@/lib/cycles/flag";
import type { CycleInput } from "@/lib/schemas/cycle";
import { loadLotHistory } from "@/lib/server/cycles/lot-history";
import { recordCyclesIn } from "@/lib/server/cycles/record-cycles";

export interface CycleBench {
  cycles: number;
  lots: number;
  importSeconds: number;
  /** Lot histories, each a lot of three cycles on the full table. */
  lotP50: number;
  lotP95: number;
  lotMax: number;
  lotPlan: string;
  dbMegabytes: number;
}

const HOUR = 3_600_000;
const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)];
};

/** Records `count` cycles on the qualified combinations in force now, and times the lot histories. */
export async function measureCycles(db: Database, count: number, repeat = 60): Promise<CycleBench> {
  const [operator] = await db
    .select({ id: users.id, name: users.name })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(inArray(userRoles.role, ["technician", "engineer"]))
    .limit(1);
  const combos = await db
    .select({
      versionId: recipeVersions.id,
      version: recipeVersions.version,
      effectiveFrom: recipeVersions.effectiveFrom,
      recipe: recipes.code,
      system: cleaningSystems.code,
      family: partFamilies.code,
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .where(and(eq(recipeVersions.status, "effective"), eq(cleaningSystems.active, true)));
  if (!operator || combos.length === 0)
    throw new Error("No qualified effective combination to run cycles on.");
  const params = await db
    .select()
    .from(recipeParameters)
    .where(
      inArray(
        recipeParameters.versionId,
        combos.map((c) => c.versionId),
      ),
    );
  const values = new Map<string, Record<string, number>>();
  for (const c of combos)
    values.set(
      c.versionId,
      Object.fromEntries(
        params
          .filter((p) => p.versionId === c.versionId && isCycleValue(p))
          .map((p) => [p.key, p.setpoint]),
      ),
    );
  // Cycles run after every version's start: one every few minutes per washer, back from an hour ago.
  const latestStart = Math.max(...combos.map((c) => Date.parse(c.effectiveFrom ?? "2020-01-01")));
  const end = Math.max(Date.now() - HOUR, latestStart + (count + 10) * 60_000);
  const cycles: CycleInput[] = [];
  for (let i = 0; i < count; i++) {
    const c = combos[i % combos.length];
    const start = end - (count - i) * 60_000;
    // A lot is washed in three cycles of its combination.
    const lot = `B${c.family}-${Math.floor(i / (3 * combos.length))}`;
    cycles.push({
      cycleNumber: `BENCH-${i}`,
      system: c.system,
      recipe: c.recipe,
      version: c.version,
      partFamily: c.family,
      lots: [lot],
      baskets: 2,
      startedAt: new Date(start).toISOString(),
      endedAt: new Date(start + 40 * 60_000).toISOString(),
      operator: operator.name,
      values: values.get(c.versionId)!,
    });
  }
  const t0 = performance.now();
  await db.transaction((tx) => recordCyclesIn(tx, operator, { source: "csv", cycles }));
  const importSeconds = (performance.now() - t0) / 1000;
  await db.run(sql`ANALYZE`);
  const lots = [...new Set(cycles.map((c) => c.lots[0]))];
  const ms: number[] = [];
  await loadLotHistory(db, lots[0]); // warm
  for (let i = 0; i < repeat; i++) {
    const lot = lots[Math.floor((i * 7919) % lots.length)];
    const s = performance.now();
    const h = await loadLotHistory(db, lot);
    ms.push(performance.now() - s);
    if (h.cycles.length === 0) throw new Error(`Lot ${lot} came back empty.`);
  }
  const plan = await db.all<{ detail: string }>(
    sql`explain query plan select * from wash_cycle_lots l join wash_cycles c on c.id = l.cycle_id where l.lot_number = ${lots[0]}`,
  );
  const [{ size }] = await db.all<{ size: number }>(
    sql`select page_count * page_size as size from pragma_page_count(), pragma_page_size()`,
  );
  return {
    cycles: count,
    lots: lots.length,
    importSeconds,
    lotP50: pct(ms, 50),
    lotP95: pct(ms, 95),
    lotMax: Math.max(...ms),
    lotPlan: plan.map((p) => p.detail).join("; "),
    dbMegabytes: size / 1e6,
  };
}

export const cycleBenchLine = (b: CycleBench) =>
  `Wash cycles: ${b.cycles.toLocaleString("en")} cycles (${b.lots.toLocaleString("en")} lots) recorded through the cycle service in one call in ${b.importSeconds.toFixed(1)} s (${Math.round(b.cycles / b.importSeconds).toLocaleString("en")} cycles/s); lot history on the full table p50 ${b.lotP50.toFixed(1)} ms, p95 ${b.lotP95.toFixed(1)} ms, longest ${b.lotMax.toFixed(1)} ms; lot lookup plan: ${b.lotPlan}.`;

if (import.meta.url === `file://${process.argv[1]}`) {
  const count = Number(process.argv.find((a) => a.startsWith("--cycles="))?.slice(9) ?? 100_000);
  const dir = mkdtempSync(join(tmpdir(), "washproof-cycles-bench-"));
  const { db, client } = openDatabase(`file:${join(dir, "bench.db")}`);
  try {
    await migrateDatabase(db, client);
    // The seed's change requests go through the services, which use the process database.
    setProcessDatabase(db, client);
    const { seedDemo } = await import("@/db/seed");
    await seedDemo(db);
    console.log(cycleBenchLine(await measureCycles(db, count)));
  } finally {
    client.close();
    rmSync(dir, { recursive: true, force: true });
  }
}
