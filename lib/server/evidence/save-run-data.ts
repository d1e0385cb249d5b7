import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { testRuns } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { ParticleRunData } from "@/lib/schemas/evidence";
import { UserFacingError } from "@/lib/server/errors";
import { requireOpenRun } from "./guards";
import { refreshOutcome } from "./refresh-outcome";

/** Saves a particle run's extraction series and blank. */
export async function saveRunData(
  actor: AuditActor,
  input: { runId: string; data: ParticleRunData },
) {
  return getDb().transaction(async (tx) => {
    const run = await requireOpenRun(tx, input.runId);
    if (run.testType !== "particle_cleanliness")
      throw new UserFacingError(
        "Only particle cleanliness runs have an extraction series and blank.",
        { kind: "invalid" },
      );
    const [updated] = await tx
      .update(testRuns)
      .set({ runData: input.data })
      .where(eq(testRuns.id, run.id))
      .returning();
    const outcome = await refreshOutcome(tx, updated);
    await appendAudit(tx, actor, {
      eventType: "test_run.data_saved",
      recordType: "test_run",
      recordId: run.id,
      old: { runData: run.runData ?? null },
      new: { runData: input.data, outcome: outcome.outcome },
    });
  });
}
