import type { Outcome } from "@/db/enums";
import type { LimitState } from "@/lib/bath/limits";
import type { MaintenanceState } from "@/lib/evidence/maintenance";
import { can, type Role } from "@/lib/auth/permissions";

/**
 * A washer's state on the plant overview, worst first. "Action needed": something is beyond a
 * limit or past its date now; "needs attention": something is drawing near one or is open.
 */
export type OverviewState = "action" | "attention" | "in_order";

export const OVERVIEW_STATE_LABELS: Record<OverviewState, string> = {
  action: "Action needed",
  attention: "Needs attention",
  in_order: "In order",
};

export type DueState = "overdue" | "due_soon" | "not_due";

export interface WasherFacts {
  /** The state of each tank's latest graded reading; null for a tank not yet graded. */
  tanks: { name: string; state: LimitState | null }[];
  /** Equipment checks, bath changes and readings with an interval. */
  checks: { name: string; state: MaintenanceState }[];
  /** The newest verified result of each washer × part family × test type. */
  lastResults: { name: string; outcome: Outcome | null }[];
  requalifications: { name: string; state: DueState }[];
  openNonconformances: number;
  activeDeviations: number;
  /** Emergency changes in force whose approval is past its date. */
  overdueEmergencies: number;
  /** Emergency changes in force still awaiting approval within their date. */
  awaitingEmergencies: number;
}

export interface WasherState {
  state: OverviewState;
  /** Why, in words, worst first: the state is never read from a colour alone. */
  reasons: string[];
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** The washer's state and its reasons: the worst of its baths, checks, results, dates and open records. */
export function washerState(f: WasherFacts): WasherState {
  const action: string[] = [];
  const attention: string[] = [];
  for (const t of f.tanks) {
    if (t.state === "reject") action.push(`${t.name}: beyond reject limit`);
    else if (t.state === "action") attention.push(`${t.name}: beyond action limit`);
  }
  for (const r of f.lastResults)
    if (r.outcome === "fail") action.push(`${r.name}: last verified result failed`);
  for (const c of f.checks) {
    if (c.state === "overdue") action.push(`${c.name}: overdue`);
    else if (c.state === "due") attention.push(`${c.name}: due`);
  }
  for (const q of f.requalifications) {
    if (q.state === "overdue") action.push(`${q.name}: requalification overdue`);
    else if (q.state === "due_soon") attention.push(`${q.name}: requalification due soon`);
  }
  if (f.overdueEmergencies > 0)
    action.push(`${plural(f.overdueEmergencies, "emergency change")} past approval date`);
  if (f.awaitingEmergencies > 0)
    attention.push(`${plural(f.awaitingEmergencies, "emergency change")} awaiting approval`);
  if (f.openNonconformances > 0)
    attention.push(`${plural(f.openNonconformances, "open nonconformance")}`);
  if (f.activeDeviations > 0)
    attention.push(`${plural(f.activeDeviations, "active temporary deviation")}`);
  if (action.length > 0) return { state: "action", reasons: [...action, ...attention] };
  if (attention.length > 0) return { state: "attention", reasons: attention };
  return { state: "in_order", reasons: [] };
}

/** The plant's state: the worst of its washers'. */
export function worstState(states: readonly OverviewState[]): OverviewState {
  if (states.includes("action")) return "action";
  if (states.includes("attention")) return "attention";
  return "in_order";
}

/**
 * Where a person lands after signing in: engineers and administrators on the plant overview (they
 * watch the whole plant), anyone else with a queue on My queue, the rest (auditors) on the
 * cleaning systems, as before the overview existed.
 */
export function landingPath(roles: readonly Role[]): string {
  if (roles.includes("engineer") || roles.includes("admin")) return "/overview";
  if (can(roles, "queue.view")) return "/queue";
  return "/systems";
}
