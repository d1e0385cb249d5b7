import "server-only";
import { eq } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { changeControlSettings } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { DEFAULT_EFFECTIVENESS_RUNS } from "@/lib/changes/effectiveness";
import { DEFAULT_EMERGENCY_APPROVAL_DAYS } from "@/lib/changes/emergency";

export interface ChangeControlSettingValues {
  emergencyApprovalDays: number;
  effectivenessRuns: number;
}

const ROW_ID = "change_control";

/** The plant's setting, or the defaults when an administrator never saved one. */
export async function getChangeControlSettings(db: Executor): Promise<ChangeControlSettingValues> {
  const [row] = await db
    .select()
    .from(changeControlSettings)
    .where(eq(changeControlSettings.id, ROW_ID));
  return {
    emergencyApprovalDays: row?.emergencyApprovalDays ?? DEFAULT_EMERGENCY_APPROVAL_DAYS,
    effectivenessRuns: row?.effectivenessRuns ?? DEFAULT_EFFECTIVENESS_RUNS,
  };
}

/** Saves both settings; the change counts for emergencies implemented and changes closed from now on. */
export async function setChangeControlSettings(
  actor: AuditActor & { id: string },
  input: ChangeControlSettingValues,
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const old = await getChangeControlSettings(tx);
    const at = now.toISOString();
    await tx
      .insert(changeControlSettings)
      .values({ id: ROW_ID, ...input, updatedBy: actor.id, updatedAt: at })
      .onConflictDoUpdate({
        target: changeControlSettings.id,
        set: { ...input, updatedBy: actor.id, updatedAt: at },
      });
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change_control_settings.saved",
        recordType: "change_control_settings",
        recordId: ROW_ID,
        old,
        new: input,
      },
      now,
    );
  });
}
