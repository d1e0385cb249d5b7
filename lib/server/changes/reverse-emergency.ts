import "server-only";
import { and, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { recipeVersions } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { ChangeState } from "./state";

/**
 * A rejected or withdrawn emergency change leaves force: its version is withdrawn and the
 * version it replaced is effective again, in the rejection's transaction, so the recipe is
 * never without an effective version.
 */
export async function reverseEmergency(
  tx: Tx,
  actor: AuditActor,
  state: ChangeState,
  reason: string,
  now: Date,
) {
  const previous = state.fromVersion!;
  const at = now.toISOString();
  await tx
    .update(recipeVersions)
    .set({ status: "withdrawn", effectiveTo: at })
    .where(and(eq(recipeVersions.id, state.toVersion.id), eq(recipeVersions.status, "effective")));
  await tx
    .update(recipeVersions)
    .set({ status: "effective", effectiveTo: null })
    .where(eq(recipeVersions.id, previous.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "recipe_version.emergency_reversed",
      recordType: "recipe_version",
      recordId: state.toVersion.id,
      old: { status: "effective" },
      new: { status: "withdrawn", effectiveTo: at, changeRequest: state.cr.number },
      reason,
    },
    now,
  );
  await appendAudit(
    tx,
    actor,
    {
      eventType: "recipe_version.restored",
      recordType: "recipe_version",
      recordId: previous.id,
      old: { status: "superseded" },
      new: { status: "effective", changeRequest: state.cr.number },
      reason,
    },
    now,
  );
}
