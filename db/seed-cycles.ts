import { and, eq, isNotNull, like } from "drizzle-orm";
import type { Tx } from "./client";
import {
  cleaningSystems,
  partFamilies,
  recipeParameters,
  recipes,
  recipeVersions,
  requalificationIntervals,
  testRuns,
  testSamples,
  users,
} from "./schema";
import { isCycleValue } from "@/lib/cycles/flag";
import { todayUtc } from "@/lib/format/date";
import { inForceAt } from "@/lib/cycles/in-force";
import type { CycleInput } from "@/lib/schemas/cycle";
import { asOf } from "@/lib/audit/seed-stamp";
import { recordCyclesIn } from "@/lib/server/cycles/record-cycles";

const DAY = 86_400_000;
const HOUR = 3_600_000;
const yymmdd = (t: number) => new Date(t).toISOString().slice(2, 10).replaceAll("-", "");
/** "PF-VB-210" → "VB210": the short family mark printed on the lot travellers. */
const familyMark = (code: string) => code.replace(/^PF-/, "").replaceAll("-", "");
/** The cycles in groups by key, in key order (Map.groupBy needs Node 21). */
function groupSorted<K extends string | number>(cycles: CycleInput[], key: (c: CycleInput) => K) {
  const groups = new Map<K, CycleInput[]>();
  for (const c of cycles) {
    const k = key(c);
    const group = groups.get(k);
    if (group) group.push(c);
    else groups.set(k, [c]);
  }
  return [...groups].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
}

/**
 * The demo's wash cycles, recorded through the same service as the form, the log import and the API:
 * the morning cycles the valve-body test parts came out of (their samples name them), and two cycles a
 * shift-day on each washer over the last 120 days on whatever qualified combination was in force, one
 * of them flagged for a wash temperature below its validated range.
 */
export async function seedCycles(tx: Tx, now = new Date()) {
  const [operator] = await tx
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(eq(users.email, "technician@fennmoor.example"));
  if (!operator) return;
  const combos = await tx
    .select({
      versionId: recipeVersions.id,
      version: recipeVersions.version,
      status: recipeVersions.status,
      effectiveFrom: recipeVersions.effectiveFrom,
      effectiveTo: recipeVersions.effectiveTo,
      recipe: recipes.code,
      system: cleaningSystems.code,
      family: partFamilies.code,
    })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .orderBy(recipes.code, partFamilies.code, recipeVersions.version);
  const params = await tx.select().from(recipeParameters);
  let wobbleSeed = 0;
  const valuesFor = (versionId: string, flagTemperature = false) => {
    const out: Record<string, number> = {};
    for (const p of params.filter((x) => x.versionId === versionId && isCycleValue(x))) {
      wobbleSeed += 1;
      const w = (((wobbleSeed * 37) % 17) - 8) / 8; // −1 … +1, repeatable
      const low = p.validatedLow ?? p.setpoint;
      const high = p.validatedHigh ?? p.setpoint;
      let v =
        p.setpoint + w * 0.3 * Math.min(p.setpoint - low, high - p.setpoint || p.setpoint - low);
      if (flagTemperature && p.key === "wash.temperature" && p.validatedLow !== null)
        v = p.validatedLow - 2.5;
      out[p.key] = Math.round(v * 10) / 10;
    }
    return out;
  };

  // The cycles the valve-body test parts came out of: their samples name them (db/seed-evidence.ts).
  const named = await tx
    .selectDistinct({
      cycleNumber: testSamples.cycleNumber,
      performedOn: testRuns.performedOn,
      versionId: testRuns.recipeVersionId,
    })
    .from(testSamples)
    .innerJoin(testRuns, eq(testRuns.id, testSamples.runId))
    .where(and(isNotNull(testSamples.cycleNumber), like(testSamples.cycleNumber, "AW3-%-T_")));
  const testCycles: CycleInput[] = [];
  for (const n of named) {
    const combo = combos.find((c) => c.versionId === n.versionId && c.family === "PF-VB-210");
    if (!combo || !n.performedOn || !n.cycleNumber) continue;
    const slot = Number(n.cycleNumber.at(-1)) - 1;
    const start = Date.parse(`${n.performedOn}T05:00:00.000Z`) + slot * 50 * 60_000;
    if (!inForceAt(combo, new Date(start).toISOString())) continue;
    testCycles.push({
      cycleNumber: n.cycleNumber,
      system: combo.system,
      recipe: combo.recipe,
      version: combo.version,
      partFamily: combo.family,
      lots: [`${familyMark(combo.family)}-${yymmdd(start)}`],
      baskets: 2,
      startedAt: new Date(start).toISOString(),
      endedAt: new Date(start + 42 * 60_000).toISOString(),
      operator: operator.name,
      values: valuesFor(combo.versionId),
    });
  }
  // Each test day's cycles are entered on the form that morning, before the run is opened at 08:00.
  for (const [day, cycles] of groupSorted(testCycles, (c) => todayUtc(new Date(c.startedAt)))) {
    const recordedAt = new Date(`${day}T07:30:00.000Z`);
    await asOf(recordedAt, null, () =>
      recordCyclesIn(tx, operator, { source: "form", cycles }, recordedAt),
    );
  }

  // Routine production: two cycles a day on each washer, on the combinations in force.
  const first = Math.floor(now.getTime() / DAY) * DAY - 120 * DAY;
  const routine: CycleInput[] = [];
  const systems = [...new Set(combos.map((c) => c.system))].sort();
  for (const [si, system] of systems.entries())
    for (let d = 0; d < 119; d++)
      for (let shift = 0; shift < 2; shift++) {
        const start = first + d * DAY + (6 + shift * 8) * HOUR + si * 25 * 60_000;
        const at = new Date(start).toISOString();
        const open = combos.filter((c) => c.system === system && inForceAt(c, at));
        if (open.length === 0) continue;
        const combo = open[(d * 2 + shift) % open.length];
        const lot = `${familyMark(combo.family)}-${yymmdd(start)}`;
        routine.push({
          cycleNumber: `${system.replace("-", "")}-${yymmdd(start)}-${shift + 1}`,
          system,
          recipe: combo.recipe,
          version: combo.version,
          partFamily: combo.family,
          // Every third cycle finishes one lot and starts the next.
          lots: d % 3 === 2 && shift === 1 ? [lot, `${lot}B`] : [lot],
          baskets: 2 + ((d + shift) % 3),
          startedAt: at,
          endedAt: new Date(start + (38 + ((d * 7) % 9)) * 60_000).toISOString(),
          operator: operator.name,
          values: valuesFor(combo.versionId, si === 0 && d === 60 && shift === 0),
        });
      }
  // The washers' logs are imported once a week, the morning after the week's last shift; the
  // flagged cycle's event then carries the day its week was imported.
  const weekOf = (c: CycleInput) => Math.floor((Date.parse(c.startedAt) - first) / (7 * DAY));
  for (const [week, cycles] of groupSorted(routine, weekOf)) {
    const recordedAt = new Date(first + (week + 1) * 7 * DAY + 7 * HOUR);
    await asOf(recordedAt, null, () =>
      recordCyclesIn(tx, operator, { source: "csv", cycles }, recordedAt),
    );
  }
}
