import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { nonconformanceItems } from "@/db/schema";
import type { AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { setItemHoldIn } from "./set-item-hold";
import { assertWorkable, loadNc } from "./shared";

/**
 * Holds or releases, at once, every affected item nobody has decided on yet: a containment can
 * list a hundred cycles, and judging them one click at a time is how items get missed. Each item
 * is marked, and audited, exactly as if marked on its own, in one transaction.
 */
export async function setPendingItemsHold(
  actor: AuditActor & { id: string },
  input: { nonconformanceId: string; hold: "held" | "released" },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const nc = await loadNc(tx, input.nonconformanceId);
    assertWorkable(nc);
    const pending = await tx
      .select({ id: nonconformanceItems.id })
      .from(nonconformanceItems)
      .where(
        and(
          eq(nonconformanceItems.nonconformanceId, nc.id),
          eq(nonconformanceItems.hold, "pending"),
          isNull(nonconformanceItems.disposition),
        ),
      );
    if (pending.length === 0) throw new UserFacingError("No item is waiting for a decision.");
    for (const item of pending)
      await setItemHoldIn(
        tx,
        actor,
        { nonconformanceId: nc.id, itemId: item.id, hold: input.hold },
        now,
      );
    return { count: pending.length };
  });
}
