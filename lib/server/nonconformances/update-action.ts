import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformanceActions } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertWorkable, loadNc } from "./shared";

/** Moves an action on; "done" needs the evidence that shows it done. */
export async function updateActionIn(
  tx: Tx,
  actor: AuditActor,
  input: {
    nonconformanceId: string;
    actionId: string;
    status: "open" | "in_progress" | "done";
    evidenceLink: string | null;
  },
  now = new Date(),
) {
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
    throw new UserFacingError("That action is not on this nonconformance.", { kind: "not_found" });
  if (input.status === "done" && !input.evidenceLink?.trim())
    throw new UserFacingError(
      "Say where the work is shown done (a run number, a document, a change request).",
      { kind: "invalid", field: "evidenceLink" },
    );
  const evidenceLink = input.evidenceLink?.trim() || null;
  if (action.status === input.status && action.evidenceLink === evidenceLink) return;
  await tx
    .update(nonconformanceActions)
    .set({
      status: input.status,
      evidenceLink,
      doneAt: input.status === "done" ? now.toISOString() : null,
    })
    .where(eq(nonconformanceActions.id, action.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.action_updated",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { action: action.id, status: action.status, evidenceLink: action.evidenceLink },
      new: { action: action.id, status: input.status, evidenceLink },
    },
    now,
  );
}

export const updateAction = (actor: AuditActor, input: Parameters<typeof updateActionIn>[2]) =>
  getDb().transaction((tx) => updateActionIn(tx, actor, input));
