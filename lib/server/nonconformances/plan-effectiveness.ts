import { eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformances } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertWorkable, loadNc } from "./shared";

/** What will show the actions worked, and by when it is checked. */
export async function planEffectivenessIn(
  tx: Tx,
  actor: AuditActor,
  input: { nonconformanceId: string; criterion: string; dueOn: string },
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  assertWorkable(nc);
  if (nc.effectivenessResult === "confirmed")
    throw new UserFacingError("The effectiveness check is already confirmed.");
  if (input.dueOn < nc.detectedOn)
    throw new UserFacingError(
      `The check cannot fall due before the nonconformance was detected (${nc.detectedOn}).`,
      { kind: "invalid", field: "dueOn" },
    );
  await tx
    .update(nonconformances)
    .set({ effectivenessCriterion: input.criterion, effectivenessDueOn: input.dueOn })
    .where(eq(nonconformances.id, nc.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.effectiveness_planned",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { criterion: nc.effectivenessCriterion, dueOn: nc.effectivenessDueOn },
      new: { criterion: input.criterion, dueOn: input.dueOn },
    },
    now,
  );
}

export const planEffectiveness = (
  actor: AuditActor,
  input: Parameters<typeof planEffectivenessIn>[2],
) => getDb().transaction((tx) => planEffectivenessIn(tx, actor, input));
