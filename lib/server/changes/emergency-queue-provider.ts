import "server-only";
import { eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests, emergencyChanges, recipes } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { emergencyApprovalState } from "@/lib/changes/emergency";
import { todayUtc } from "@/lib/format/date";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { openChangeIds } from "./queue-provider";

/**
 * Emergency changes in force past their approval deadline, for approvers and administrators
 * (the escalation e-mail goes out once; the item stays until an approver signs or rejects).
 */
export const emergencyQueueProvider: QueueProvider = async (user, now) => {
  const approver = can(user.roles, "change.approve");
  const admin = user.roles.includes("admin");
  if (!approver && !admin) return { items: [] };
  const today = todayUtc(now);
  const rows = await getDb()
    .select({ e: emergencyChanges, cr: changeRequests, recipeCode: recipes.code })
    .from(emergencyChanges)
    .innerJoin(changeRequests, eq(changeRequests.id, emergencyChanges.changeRequestId))
    .innerJoin(recipes, eq(recipes.id, changeRequests.recipeId))
    .where(inArray(emergencyChanges.changeRequestId, openChangeIds));
  const items: QueueItem[] = [];
  for (const { e, cr, recipeCode } of rows) {
    const state = emergencyApprovalState({
      status: cr.status,
      approvalDueOn: e.approvalDueOn,
      today,
    });
    // Awaiting approval, it is the approver's "Change approval" item (marked Emergency there).
    if (state !== "overdue") continue;
    items.push({
      id: `emergency:${cr.id}`,
      kind: "Emergency approval overdue",
      title: `Emergency · ${cr.number} ${cr.title}`,
      detail: `${recipeCode} · in force before approval; approval due by ${e.approvalDueOn}`,
      href: `/changes/${cr.id}`,
      due: `${e.approvalDueOn}T23:59:59.000Z`,
    });
  }
  return { items };
};
