import { eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformances } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { transitionProblem, type NcStatus } from "@/lib/nonconformances/lifecycle";
import { UserFacingError } from "@/lib/server/errors";
import { loadNc, ncFacts } from "./shared";

/**
 * One working step forward (open → contained → cause found → actions under way →
 * effectiveness check), or cancelled with a reason. Closure is signed, not stepped.
 */
export async function advanceNonconformanceIn(
  tx: Tx,
  actor: AuditActor,
  input: {
    nonconformanceId: string;
    to: Exclude<NcStatus, "closed" | "open">;
    reason?: string | null;
  },
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  if (input.to === "cancelled" && !input.reason?.trim())
    throw new UserFacingError("Say why the nonconformance is cancelled.", {
      kind: "invalid",
      field: "reason",
    });
  const problem = transitionProblem(nc.status, input.to, await ncFacts(tx, nc));
  if (problem) throw new UserFacingError(problem);
  await tx
    .update(nonconformances)
    .set({
      status: input.to,
      cancelReason: input.to === "cancelled" ? input.reason!.trim() : nc.cancelReason,
      closedAt: input.to === "cancelled" ? now.toISOString() : nc.closedAt,
    })
    .where(eq(nonconformances.id, nc.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.status_changed",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { status: nc.status },
      new: { status: input.to },
      reason: input.reason?.trim() || null,
    },
    now,
  );
}

export const advanceNonconformance = (
  actor: AuditActor,
  input: Parameters<typeof advanceNonconformanceIn>[2],
) => getDb().transaction((tx) => advanceNonconformanceIn(tx, actor, input));
