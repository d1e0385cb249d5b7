import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  controlPlans,
  controlPlanVersions,
  partFamilies,
  recipes,
  recipeVersions,
} from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import {
  CHARACTERISTIC_LABELS,
  DUE_STATE_LABELS,
  frequencyWords,
  sampleWords,
} from "@/lib/control-plans/characteristics";
import { formatDateTime } from "@/lib/format/date";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { listDueControlPlanTests, type DueControlPlanTest } from "./due-tests";
import { combinationName } from "./state";

/** Where a due test is done: a new run prefilled for the combination, or the tank's bath log. */
export function dueTestHref(t: DueControlPlanTest): string {
  if (t.testType) {
    const query = new URLSearchParams({
      recipeVersion: t.recipeVersionId,
      partFamily: t.partFamilyId,
      testType: t.testType,
      samples: String(t.sampleSize),
    });
    return `/evidence/runs/new?${query}`;
  }
  return t.stageId ? `/evidence/bath/${t.stageId}` : `/control-plans/${t.controlPlanId}`;
}

/**
 * Technicians get each due or overdue routine test (due at its overdue time, so the queue marks it
 * late when it is); reviewers and approvers get the versions waiting for their signature.
 */
export const controlPlanQueueProvider: QueueProvider = async (user, now) => {
  const items: QueueItem[] = [];
  if (can(user.roles, "control_plan.perform")) {
    for (const t of await listDueControlPlanTests({ now, states: ["due", "overdue"] })) {
      const where = t.tank ? ` on ${t.tank}` : "";
      items.push({
        id: `control-plan-test:${t.lineId}`,
        kind: "Routine test",
        title: `${CHARACTERISTIC_LABELS[t.characteristic]}${where} · ${t.combination}`,
        detail: `${DUE_STATE_LABELS[t.state]} since ${formatDateTime(t.state === "overdue" ? t.overdueAt : t.dueAt)}; ${frequencyWords(t.frequency, t.everyN).toLowerCase()}, ${sampleWords(t.characteristic, t.sampleSize)}${t.minCycles ? ` from ${t.minCycles} cycles` : ""} (${t.method})`,
        href: dueTestHref(t),
        // A line counting cycles has no overdue time until its second interval starts: it is
        // due (and sorted) from when it fell due.
        due: t.overdueAt ?? t.dueAt,
      });
    }
  }
  const waiting = [
    ...(can(user.roles, "control_plan.review") ? (["in_review"] as const) : []),
    ...(can(user.roles, "control_plan.approve") ? (["reviewed"] as const) : []),
  ];
  if (waiting.length) {
    const rows = await getDb()
      .select({
        v: controlPlanVersions,
        planId: controlPlans.id,
        recipeCode: recipes.code,
        version: recipeVersions.version,
        familyCode: partFamilies.code,
      })
      .from(controlPlanVersions)
      .innerJoin(controlPlans, eq(controlPlans.id, controlPlanVersions.planId))
      .innerJoin(recipeVersions, eq(recipeVersions.id, controlPlans.recipeVersionId))
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .innerJoin(partFamilies, eq(partFamilies.id, controlPlans.partFamilyId))
      .where(and(inArray(controlPlanVersions.status, waiting)));
    for (const r of rows) {
      if (r.v.createdBy === user.id) continue;
      const review = r.v.status === "in_review";
      items.push({
        id: `control-plan-${review ? "review" : "approve"}:${r.v.id}`,
        kind: review ? "Control plan review" : "Control plan approval",
        title: `Control plan ${combinationName(r.recipeCode, r.version, r.familyCode)}, version ${r.v.version}`,
        detail: review
          ? "Signed by its author: review it"
          : "Reviewed: approve it to make it effective",
        href: `/control-plans/${r.planId}`,
        due: null,
      });
    }
  }
  return { items };
};
