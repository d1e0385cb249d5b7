import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { deviations } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { stepProblem } from "@/lib/deviations/rules";
import { UserFacingError } from "@/lib/server/errors";
import { loadDeviation } from "./state";

/** Ends a draft or an active deviation early, with the reason on record. */
export async function withdrawDeviation(
  actor: { id: string; name: string },
  input: { deviationId: string; reason: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const view = await loadDeviation(tx, input.deviationId, now);
    const problem = stepProblem("withdraw", view.state);
    if (problem) throw new UserFacingError(problem);
    const from = view.deviation.status as "draft" | "approved";
    await tx
      .update(deviations)
      .set({ status: "withdrawn", endedAt: now.toISOString() })
      .where(eq(deviations.id, view.deviation.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "deviation.withdrawn",
        recordType: "deviation",
        recordId: view.deviation.id,
        old: { status: from },
        new: { status: "withdrawn" },
        reason: input.reason,
      },
      now,
    );
  });
}
