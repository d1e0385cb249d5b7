import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformanceItems } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertWorkable, loadNc } from "./shared";

/** Marks one affected item held (kept from the customer) or released (judged unaffected). */
export async function setItemHoldIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: { nonconformanceId: string; itemId: string; hold: "held" | "released" },
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  assertWorkable(nc);
  const [item] = await tx
    .select()
    .from(nonconformanceItems)
    .where(
      and(
        eq(nonconformanceItems.id, input.itemId),
        eq(nonconformanceItems.nonconformanceId, nc.id),
      ),
    );
  if (!item)
    throw new UserFacingError("That item is not in this containment.", { kind: "not_found" });
  if (item.hold === input.hold) return;
  if (item.disposition && input.hold === "released")
    throw new UserFacingError(
      `${item.label} already has a disposition; a dispositioned item stays held.`,
    );
  await tx
    .update(nonconformanceItems)
    .set({ hold: input.hold, holdBy: actor.id, holdAt: now.toISOString() })
    .where(eq(nonconformanceItems.id, item.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.item_hold_set",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { item: item.label, hold: item.hold },
      new: { item: item.label, hold: input.hold },
    },
    now,
  );
}

export const setItemHold = (
  actor: AuditActor & { id: string },
  input: Parameters<typeof setItemHoldIn>[2],
) => getDb().transaction((tx) => setItemHoldIn(tx, actor, input));
