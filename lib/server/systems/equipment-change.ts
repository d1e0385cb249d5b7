import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import type { Tx } from "@/db/client";
import {
  changeRequestEquipment,
  changeRequests,
  cleaningSystems,
  type CleaningSystem,
  type SystemStage,
} from "@/db/schema";
import type { AuditActor } from "@/lib/audit";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import { equipmentImpact } from "@/lib/plant/equipment";
import { openChangeRequestIn } from "@/lib/server/changes/open-change-request";
import type { EquipmentAfter, EquipmentBefore } from "@/lib/server/changes/subjects";
import type { SystemInput } from "@/lib/schemas/system";
import { UserFacingError } from "@/lib/server/errors";
import { completeInput, stagesOf, writeSystem } from "./update-system";

/**
 * Opens a change request of kind "equipment" for an edit of a washer that runs effective recipes.
 * It is filed on the first of those recipes (one change request carries one recipe); the others
 * are named on it, because the same equipment serves them. One open equipment change per washer.
 */
export async function openEquipmentChange(
  tx: Tx,
  actor: AuditActor & { id: string },
  args: {
    system: CleaningSystem;
    before: SystemStage[];
    input: ReturnType<typeof completeInput>;
    running: { id: string; code: string; version: number }[];
  },
) {
  const { system, before, input, running } = args;
  const [open] = await tx
    .select({ number: changeRequests.number })
    .from(changeRequestEquipment)
    .innerJoin(changeRequests, eq(changeRequests.id, changeRequestEquipment.changeRequestId))
    .where(
      and(
        eq(changeRequestEquipment.systemId, system.id),
        inArray(changeRequests.status, OPEN_STATUSES),
      ),
    );
  if (open)
    throw new UserFacingError(
      `Equipment change ${open.number} is already open on ${system.code}: finish or withdraw it first.`,
      { kind: "conflict" },
    );
  const { changes } = equipmentImpact(before, input.stages);
  const first = changes.find((c) => c.impact !== "editorial")!;
  const cr = await openChangeRequestIn(tx, actor, {
    recipeId: running[0].id,
    kind: "equipment",
    title: `Equipment change on ${system.code}: ${first.stage} — ${first.reason}`.slice(0, 200),
  });
  const stored: EquipmentBefore = {
    name: system.name,
    description: system.description,
    stages: before.map((b) => ({
      id: b.id,
      name: b.name,
      kind: b.kind,
      capabilities: b.capabilities,
      tankVolumeL: b.tankVolumeL,
      filterRatingUm: b.filterRatingUm,
      ultrasonicPowerW: b.ultrasonicPowerW,
      ultrasonicFrequencyKHz: b.ultrasonicFrequencyKHz,
      sprayPressureBar: b.sprayPressureBar,
      injectionPressureBar: b.injectionPressureBar,
      nozzleSet: b.nozzleSet,
    })),
    alsoRuns: running.slice(1).map((r) => `${r.code} v${r.version}`),
  };
  const after: EquipmentAfter = input;
  await tx
    .insert(changeRequestEquipment)
    .values({ changeRequestId: cr.id, systemId: system.id, before: stored, after });
  return cr;
}

/**
 * Closing an equipment change writes the proposed equipment to the washer, audited with the
 * change request as its reason. The stages are read afresh: wording edited meanwhile is kept
 * where the proposal did not touch it, and a stage removed meanwhile cannot be, so the edit holds.
 */
export async function applyEquipmentChange(
  tx: Tx,
  actor: AuditActor,
  cr: { id: string; number: string },
  at: string,
) {
  const [row] = await tx
    .select()
    .from(changeRequestEquipment)
    .where(eq(changeRequestEquipment.changeRequestId, cr.id));
  if (!row || row.appliedAt) return;
  const [system] = await tx
    .select()
    .from(cleaningSystems)
    .where(eq(cleaningSystems.id, row.systemId));
  if (!system.active)
    throw new UserFacingError(
      `${system.code} was retired: its equipment change cannot be applied.`,
      {
        kind: "locked",
      },
    );
  const before = await stagesOf(tx, system.id);
  const after = row.after as SystemInput;
  const input = completeInput({ ...after, systemId: system.id }, before);
  await writeSystem(tx, actor, system, before, input, `Equipment change ${cr.number} closed.`);
  await tx
    .update(changeRequestEquipment)
    .set({ appliedAt: at })
    .where(eq(changeRequestEquipment.changeRequestId, cr.id));
}
