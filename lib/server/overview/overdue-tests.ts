import "server-only";
import type { Executor } from "@/db/client";
import { dueState, requalificationDue } from "@/lib/changes/periodic";
import { MAINTENANCE_LABELS } from "@/lib/evidence/maintenance";
import { CHARACTERISTIC_LABELS } from "@/lib/control-plans/characteristics";
import { fromControlPlan, sortOverdue, type OverdueTest } from "@/lib/overview/overdue";
import { listDueControlPlanTests } from "@/lib/server/control-plans/due-tests";
import { listMaintenance, type MaintenanceItem } from "@/lib/server/bath/queries";
import { loadCombinations, type OverviewCombination } from "./combinations";

/** What the overview has already read, so the section costs no second query. */
export interface OverdueInputs {
  maintenance: MaintenanceItem[];
  combinations: OverviewCombination[];
}

function fromMaintenance(items: MaintenanceItem[]): OverdueTest[] {
  return items
    .filter((m) => m.status.state !== "ok")
    .map((m) => ({
      // A reading with an interval is the tank's measurement plan saying how often to measure.
      source: m.kind === "reading" ? "bath_reading" : "equipment_check",
      systemId: m.systemId,
      recipeVersionId: null,
      partFamilyId: null,
      characteristic: MAINTENANCE_LABELS[m.kind],
      subject: `${m.system} · ${m.tank}`,
      dueAt: m.status.dueAt,
      state: m.status.state === "overdue" ? "overdue" : "due",
      href: `/evidence/bath/${m.stageId}`,
    }));
}

function fromRequalifications(combinations: OverviewCombination[], now: Date): OverdueTest[] {
  const out: OverdueTest[] = [];
  for (const c of combinations) {
    const dueAt = requalificationDue(c.lastQualifiedAt, c.intervalMonths);
    const state = dueState(dueAt, now);
    if (state === "not_due") continue;
    out.push({
      source: "requalification",
      systemId: c.systemId,
      recipeVersionId: c.recipeVersionId,
      partFamilyId: c.familyId,
      characteristic: "Periodic requalification",
      subject: `${c.recipeCode} v${c.version} × ${c.familyCode}`,
      dueAt,
      state: state === "overdue" ? "overdue" : "due",
      href: `/systems/recipes/${c.recipeId}`,
    });
  }
  return out;
}

/**
 * Every test and check that is overdue or falls due soon, plant-wide: periodic requalification of
 * each qualified combination, equipment checks (filter, nozzle, ultrasonic foil, bath change) and
 * bath readings whose measurement interval has run out, and the routine tests of each effective
 * control plan that are due or overdue.
 */
export async function listOverdueTests(
  db: Executor,
  now: Date,
  loaded?: OverdueInputs,
): Promise<OverdueTest[]> {
  const [maintenance, combinations] = loaded
    ? [loaded.maintenance, loaded.combinations]
    : await Promise.all([listMaintenance(now), loadCombinations(db)]);
  const planned = await listDueControlPlanTests({ db, now, states: ["due", "overdue"] });
  const fromPlans = fromControlPlan(
    planned.map((t) => ({
      ...t,
      characteristic: CHARACTERISTIC_LABELS[t.characteristic],
      href: `/control-plans/${t.controlPlanId}`,
    })),
    combinations,
  );
  return sortOverdue([
    ...fromRequalifications(combinations, now),
    ...fromMaintenance(maintenance),
    ...fromPlans,
  ]);
}
