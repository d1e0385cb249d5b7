import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { deviations, recipes, signatures } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { daysLeft, deviationState, reminderDue } from "@/lib/deviations/rules";
import { formatDate, todayUtc } from "@/lib/format/date";
import type { QueueItem, QueueProvider } from "@/lib/server/queue/types";
import { lotsUsedOf } from "./state";

/**
 * Drafts their author has signed wait for an approver; an author's own drafts wait for their
 * signature; active deviations near their end wait for their author to plan the return.
 */
export const deviationQueueProvider: QueueProvider = async (user, now) => {
  if (!can(user.roles, "deviation.draft") && !can(user.roles, "deviation.approve"))
    return { items: [] };
  const db = getDb();
  const open = await db
    .select({ d: deviations, recipe: recipes.code })
    .from(deviations)
    .innerJoin(recipes, eq(recipes.id, deviations.recipeId))
    .where(inArray(deviations.status, ["draft", "approved"]));
  if (open.length === 0) return { items: [] };
  const ids = open.map((o) => o.d.id);
  const authored = new Set(
    (
      await db
        .select({ id: signatures.recordId })
        .from(signatures)
        .where(
          and(
            eq(signatures.recordType, "deviation"),
            eq(signatures.meaning, "authored"),
            inArray(signatures.recordId, ids),
          ),
        )
    ).map((s) => s.id),
  );
  const lots = await lotsUsedOf(db, ids);
  const today = todayUtc(now);
  const items: QueueItem[] = [];
  for (const { d, recipe } of open) {
    const base = { title: `${d.number} · ${d.title}`, href: `/deviations/${d.id}` };
    if (d.status === "draft") {
      if (authored.has(d.id) && can(user.roles, "deviation.approve") && d.createdBy !== user.id)
        items.push({
          ...base,
          id: `deviation-approve:${d.id}`,
          kind: "Deviation approval",
          detail: `Temporary deviation on ${recipe}, signed by its author`,
          due: null,
        });
      else if (!authored.has(d.id) && d.createdBy === user.id)
        items.push({
          ...base,
          id: `deviation-sign:${d.id}`,
          kind: "Deviation to sign",
          detail: `Your draft on ${recipe}: sign it to send it for approval`,
          due: null,
        });
      continue;
    }
    if (
      d.createdBy === user.id &&
      deviationState(d, today, lots.get(d.id) ?? 0) === "active" &&
      reminderDue(d.endsOn, d.reminderDays, today)
    )
      items.push({
        ...base,
        id: `deviation-ending:${d.id}`,
        kind: "Deviation ending",
        detail: `Active on ${recipe}; last day ${formatDate(d.endsOn)} (${daysLeft(d.endsOn, today)} days left)`,
        due: `${d.endsOn}T23:59:59.000Z`,
      });
  }
  return { items };
};
