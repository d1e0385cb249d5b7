/**
 * The "Overdue tests" section of the plant overview: every test or check that is past its date or
 * falls due soon, from whichever record schedules it. Each source maps its rows into this one shape;
 * the list is sorted here so the page and its tests read one order.
 */
export type OverdueSource =
  | "requalification"
  | "equipment_check"
  | "bath_reading"
  /** Due tests a control plan schedules (merged in once control plans exist). */
  | "control_plan";

export type OverdueState = "overdue" | "due";

export interface OverdueTest {
  source: OverdueSource;
  systemId: string;
  recipeVersionId: string | null;
  partFamilyId: string | null;
  /** What is tested or checked, in words: "Particle cleanliness", "Nozzle check". */
  characteristic: string;
  /** Where: "AW-3 · Wash tank", "R-AW3-VB v2 × PF-VB-210". */
  subject: string;
  dueAt: string;
  state: OverdueState;
  href: string;
}

export const OVERDUE_STATE_LABELS: Record<OverdueState, string> = {
  overdue: "Overdue",
  due: "Due soon",
};

/** The state in words: a test not yet overdue whose date has come is due now, not "soon". */
export function overdueStateLabel(item: Pick<OverdueTest, "state" | "dueAt">, now: Date): string {
  if (item.state === "due" && item.dueAt <= now.toISOString()) return "Due now";
  return OVERDUE_STATE_LABELS[item.state];
}

export const OVERDUE_SOURCE_LABELS: Record<OverdueSource, string> = {
  requalification: "Requalification",
  equipment_check: "Equipment check",
  bath_reading: "Bath reading",
  control_plan: "Control plan test",
};

/** Overdue before due, then the oldest date first; ties by subject so the order is stable. */
export function sortOverdue(items: readonly OverdueTest[]): OverdueTest[] {
  const rank = (s: OverdueState) => (s === "overdue" ? 0 : 1);
  return [...items].sort(
    (a, b) =>
      rank(a.state) - rank(b.state) ||
      (a.dueAt < b.dueAt ? -1 : a.dueAt > b.dueAt ? 1 : 0) ||
      a.subject.localeCompare(b.subject) ||
      a.characteristic.localeCompare(b.characteristic),
  );
}

/** How many of each state, for the section's heading and the summary tile. */
export function countOverdue(items: readonly OverdueTest[]): Record<OverdueState, number> {
  const out: Record<OverdueState, number> = { overdue: 0, due: 0 };
  for (const i of items) out[i.state] += 1;
  return out;
}

/** A control plan's due test as the control-plan feature reports it (`listDueControlPlanTests`). */
export interface DueControlPlanTest {
  systemId: string;
  recipeVersionId: string;
  partFamilyId: string;
  /** The characteristic in words. */
  characteristic: string;
  /** Null while the line counts cycles or lots and the count is not reached. */
  dueAt: string | null;
  state: string;
  /** The plan's own page, when known. */
  href?: string;
}

/** What a qualified combination is called and where it is shown. */
export interface CombinationName {
  recipeVersionId: string;
  familyId: string;
  recipeId: string;
  recipeCode: string;
  version: number;
  familyCode: string;
}

/** Control-plan due tests as the section's rows, named by the combinations the overview already read. */
export function fromControlPlan(
  rows: readonly DueControlPlanTest[],
  combinations: readonly CombinationName[],
): OverdueTest[] {
  const byPair = new Map(combinations.map((c) => [`${c.recipeVersionId}|${c.familyId}`, c]));
  return rows
    .filter((r) => (r.state === "overdue" || r.state === "due") && r.dueAt !== null)
    .map((r) => {
      const c = byPair.get(`${r.recipeVersionId}|${r.partFamilyId}`);
      return {
        source: "control_plan",
        systemId: r.systemId,
        recipeVersionId: r.recipeVersionId,
        partFamilyId: r.partFamilyId,
        characteristic: r.characteristic,
        subject: c ? `${c.recipeCode} v${c.version} × ${c.familyCode}` : "Qualified combination",
        dueAt: r.dueAt as string,
        state: r.state === "overdue" ? "overdue" : "due",
        href: r.href ?? (c ? `/systems/recipes/${c.recipeId}` : "/parts/combinations"),
      };
    });
}
