// Not "server-only": the demo seed runs the control-plan services under tsx.
import { eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { controlPlanLines, systemStages } from "@/db/schema";
import type { ControlPlanLineInput } from "@/lib/schemas/control-plan";
import { UserFacingError } from "@/lib/server/errors";

/** Refuses, beside each field, a tank that is not one of the combination's washer. */
export async function assertLinesFit(
  tx: Tx,
  systemId: string,
  lines: readonly ControlPlanLineInput[],
  fieldErrors: Record<string, string[]> = {},
) {
  const stages = new Set(
    (
      await tx
        .select({ id: systemStages.id })
        .from(systemStages)
        .where(eq(systemStages.systemId, systemId))
    ).map((s) => s.id),
  );
  lines.forEach((l, i) => {
    if (l.stageId !== null && !stages.has(l.stageId))
      (fieldErrors[`lines.${i}.stageId`] ??= []).push(
        "That tank is not on this combination's washer.",
      );
  });
  const problems = Object.keys(fieldErrors).length;
  if (problems)
    throw new UserFacingError(
      problems === 1
        ? "One value needs attention. Nothing was saved."
        : "Some values need attention. Nothing was saved.",
      { kind: "invalid", fieldErrors },
    );
}

export async function insertLines(
  tx: Tx,
  versionId: string,
  lines: readonly ControlPlanLineInput[],
) {
  if (lines.length === 0) return [];
  return tx
    .insert(controlPlanLines)
    .values(lines.map((l, position) => ({ ...l, versionId, position })))
    .returning();
}
