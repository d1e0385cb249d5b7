import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests, nonconformanceActions } from "@/db/schema";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { openChangeRequestIn } from "@/lib/server/changes/open-change-request";
import { UserFacingError } from "@/lib/server/errors";
import { assertWorkable, loadNc } from "./shared";

/**
 * A corrective action whose fix changes the recipe, its equipment or what it is validated
 * against opens a change request on the nonconformance's recipe, prefilled from it (or joins
 * the change already open on that recipe); the action keeps the link, so each page shows the other.
 */
export async function openChangeFromAction(
  actor: AuditActor & { id: string },
  input: {
    nonconformanceId: string;
    actionId: string;
    kind: "parameter_change" | "new_detergent" | "maintenance_interval" | "equipment";
  },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const nc = await loadNc(tx, input.nonconformanceId);
    assertWorkable(nc);
    const [action] = await tx
      .select()
      .from(nonconformanceActions)
      .where(
        and(
          eq(nonconformanceActions.id, input.actionId),
          eq(nonconformanceActions.nonconformanceId, nc.id),
        ),
      );
    if (!action)
      throw new UserFacingError("That action is not on this nonconformance.", {
        kind: "not_found",
      });
    if (action.kind !== "corrective")
      throw new UserFacingError("Only a corrective action opens a change request.");
    if (action.changeRequestId)
      throw new UserFacingError("This action already has its change request.");
    if (!nc.recipeId)
      throw new UserFacingError(
        "This nonconformance names no recipe: open the change request from the recipe's page.",
      );
    // One open change per recipe: when one is already under way, the fix joins it.
    const [already] = await tx
      .select()
      .from(changeRequests)
      .where(
        and(
          eq(changeRequests.recipeId, nc.recipeId),
          inArray(changeRequests.status, OPEN_STATUSES),
        ),
      );
    const cr =
      already ??
      (await openChangeRequestIn(
        tx,
        actor,
        {
          recipeId: nc.recipeId,
          title: `${nc.number}: ${action.description}`.slice(0, 200),
          kind: input.kind,
        },
        now,
      ));
    await tx
      .update(nonconformanceActions)
      .set({
        changeRequestId: cr.id,
        status: action.status === "open" ? "in_progress" : action.status,
      })
      .where(eq(nonconformanceActions.id, action.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "nonconformance.change_opened",
        recordType: "nonconformance",
        recordId: nc.id,
        new: { action: action.id, changeRequest: cr.number, joinedOpenChange: !!already },
      },
      now,
    );
    return cr;
  });
}
