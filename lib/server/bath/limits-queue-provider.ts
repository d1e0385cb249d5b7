import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { bathRecords, cleaningSystems, systemStages } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import { LIMIT_STATE_LABELS } from "@/lib/bath/limits";
import type { QueueProvider } from "@/lib/server/queue/types";

export const BATH_ACTION_KIND = "Bath beyond action limit";
export const BATH_REJECT_KIND = "Bath beyond reject limit (flagged)";

/**
 * The latest graded reading of each tank, where it is beyond a limit. The two states are written
 * out, not bound, so the planner can prove bath_records_beyond_limit_idx applies and reads those
 * few readings instead of the whole log.
 */
export function beyondLimitReadings() {
  return getDb()
    .select({ record: bathRecords, stage: systemStages, system: cleaningSystems })
    .from(bathRecords)
    .innerJoin(systemStages, eq(systemStages.id, bathRecords.stageId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
    .where(
      and(
        sql`${bathRecords.limitState} in ('action', 'reject')`,
        sql`not exists (select 1 from bath_records later where later.stage_id = ${bathRecords.stageId} and later.limit_state is not null and later.performed_at > ${bathRecords.performedAt})`,
      ),
    )
    .orderBy(asc(bathRecords.performedAt));
}

/**
 * Tanks whose latest graded reading is beyond an action or reject limit. The item stays until a
 * later reading of the tank is back within its limits: the reaction is proven by measuring again.
 */
export const bathLimitsQueueProvider: QueueProvider = async (user) => {
  if (!can(user.roles, "bath.record")) return { items: [] };
  const rows = await beyondLimitReadings();
  return {
    items: rows.map(({ record, stage, system }) => ({
      id: `bath-limit:${record.id}`,
      kind: record.limitState === "reject" ? BATH_REJECT_KIND : BATH_ACTION_KIND,
      title: `${system.code} · ${stage.name}`,
      detail: `${LIMIT_STATE_LABELS[record.limitState!]}: ${record.limitFindings ?? ""}. Correct the bath and measure again.`,
      href: `/evidence/bath/${stage.id}`,
      due: record.performedAt,
    })),
  };
};
