import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { bathRecords, systemStages } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { BathRecordInput } from "@/lib/schemas/evidence";
import { UserFacingError } from "@/lib/server/errors";

/** Records a bath change, filter change or reading for a tank. */
export async function recordBathEntry(
  actor: { id: string; name: string },
  input: BathRecordInput,
  now = new Date(),
) {
  const performedAt = new Date(
    input.performedAt.length === 10 ? `${input.performedAt}T12:00:00Z` : `${input.performedAt}:00Z`,
  );
  if (Number.isNaN(performedAt.getTime()))
    throw new UserFacingError("Enter a real date.", { kind: "invalid", field: "performedAt" });
  if (performedAt.getTime() > now.getTime() + 3_600_000)
    throw new UserFacingError("The date is in the future.", {
      kind: "invalid",
      field: "performedAt",
    });
  return getDb().transaction(async (tx) => {
    const [stage] = await tx.select().from(systemStages).where(eq(systemStages.id, input.stageId));
    if (!stage) throw new UserFacingError("This tank does not exist.", { kind: "not_found" });
    const { stageId, performedAt: _p, ...values } = input;
    const [row] = await tx
      .insert(bathRecords)
      .values({ stageId, ...values, performedAt: performedAt.toISOString(), recordedBy: actor.id })
      .returning();
    await appendAudit(tx, actor, {
      eventType: "bath_record.created",
      recordType: "bath_record",
      recordId: row.id,
      new: { tank: stage.name, ...values, performedAt: row.performedAt },
    });
    return row;
  });
}
