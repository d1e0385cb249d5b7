import "server-only";
import { count, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests, changeRequestTests, recipes } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import {
  countDueRequalifications,
  dueRequalificationPage,
  type RequalificationDueState,
} from "./due-requalifications";
import { loadGates } from "./snapshot";
import { loadEmergencies } from "./emergencies";
import { formatDate } from "@/lib/format/date";
import type { GateResult } from "@/lib/changes/gate";

/**
 * Open changes are few among the plant's closed ones; without per-value statistics (no STAT4 in
 * libSQL) the planner cannot tell and walks every change, so the status index is named.
 */
export const openChangeIds = sql`(select id from change_requests indexed by change_requests_status_idx where status in ${OPEN_STATUSES})`;

/** Change-control steps waiting for this user, and periodic requalifications falling due. */
export const changeQueueProvider: QueueProvider = async (user, now, window) => {
  const db = getDb();
  const items: QueueItem[] = [];
  // The fields the items print: a change's whole row carries its assessment details.
  const open = await db
    .select({
      cr: {
        id: changeRequests.id,
        number: changeRequests.number,
        title: changeRequests.title,
        status: changeRequests.status,
        impact: changeRequests.impact,
        createdBy: changeRequests.createdBy,
      },
      recipeCode: recipes.code,
    })
    .from(changeRequests)
    .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
    .where(inArray(changeRequests.id, openChangeIds));
  const tests = open.length
    ? await db
        .select({ changeRequestId: changeRequestTests.changeRequestId, n: count() })
        .from(changeRequestTests)
        .where(
          inArray(
            changeRequestTests.changeRequestId,
            open.map((o) => o.cr.id),
          ),
        )
        .groupBy(changeRequestTests.changeRequestId)
    : [];
  const requiredCount = new Map(tests.map((t) => [t.changeRequestId, t.n]));
  const gates = await loadGates(
    db,
    open.filter((o) => o.cr.status === "requalification").map((o) => o.cr.id),
  );
  const mine = (id: string) => id === user.id;
  const emergencies = await loadEmergencies(
    db,
    open.map((o) => o.cr.id),
  );
  for (const { cr, recipeCode } of open) {
    const push = (kind: string, detail: string, href = `/changes/${cr.id}`) =>
      items.push({
        id: `change:${cr.id}:${kind}`,
        kind,
        title: `${emergencies.has(cr.id) ? "Emergency · " : ""}${cr.number} ${cr.title}`,
        detail: `${recipeCode} · ${detail}`,
        href,
        due: null,
      });
    const required = requiredCount.get(cr.id) ?? 0;
    if (cr.status === "draft" && mine(cr.createdBy))
      push("Change draft", "complete the proposal and submit the impact assessment");
    if (cr.status === "impact_assessed" && can(user.roles, "change.approve"))
      push("Change approval", `${cr.impact} change to approve or reject`);
    if (cr.status === "approved_for_implementation") {
      if (required > 0 && mine(cr.createdBy))
        push("Requalification", "approved: start requalification");
      if (required === 0 && can(user.roles, "change.verify"))
        push("Change verification", "approved, no tests required: verify");
    }
    if (cr.status === "requalification") {
      const { gate } = gates.get(cr.id)!;
      if (!gate.holds && can(user.roles, "evidence.record"))
        push(
          "Requalification tests",
          `${gate.missing.length} item${gate.missing.length > 1 ? "s" : ""} missing`,
          // A technician may record the tests but not open change requests: the item opens the
          // run form for the first test still missing, filled in for this change.
          can(user.roles, "changes.view") ? undefined : firstTestToEnter(cr.id, gate),
        );
      if (gate.holds && can(user.roles, "change.verify"))
        push("Change verification", "requalification evidence complete: verify");
    }
    if (cr.status === "verified" && can(user.roles, "recipe.make_effective"))
      push("Close change", "verified: close to make the new version effective");
  }
  const totals: Record<string, number> = {};
  if (can(user.roles, "change.draft")) {
    // A plant can have hundreds of combinations due at once: each kind is counted and paged in SQL.
    const counts = await countDueRequalifications(db, now);
    for (const state of ["overdue", "due_soon"] as const satisfies RequalificationDueState[]) {
      const kind = REQUALIFICATION_KIND[state];
      totals[kind] = counts[state];
      if (counts[state] === 0) continue;
      const page = await dueRequalificationPage(
        db,
        now,
        state,
        window?.(kind) ?? { offset: 0, limit: -1 },
      );
      for (const d of page)
        items.push({
          id: `requalification:${d.interval.id}`,
          kind,
          title: `${d.recipe.code} v${d.version.version} × ${d.family.code}`,
          detail: `Periodic requalification every ${d.interval.intervalMonths} months; last ${formatDate(d.interval.lastQualifiedAt)}`,
          href: `/systems/recipes/${d.recipe.id}`,
          due: d.due,
        });
    }
  }
  return { items, totals };
};

/** The new-run form for the first requirement no run satisfies yet, as the change page links it. */
function firstTestToEnter(changeId: string, gate: GateResult): string {
  const next = gate.requirements.find((r) => r.satisfiedBy === null)?.requirement;
  const query = new URLSearchParams({ change: changeId });
  if (next) {
    query.set("testType", next.testType);
    query.set("samples", String(next.samples));
  }
  return `/evidence/runs/new?${query}`;
}

const REQUALIFICATION_KIND: Record<RequalificationDueState, string> = {
  overdue: "Requalification overdue",
  due_soon: "Requalification due",
};
