// Not "server-only": the demo seed calls `createSystemIn` under tsx.
import { eq, or } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { cleaningSystems, sites, systemStages } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { stageProblems, type EquipmentStage } from "@/lib/plant/equipment";
import type { CreateSystemInput } from "@/lib/schemas/system";
import { UserFacingError } from "@/lib/server/errors";

type StageInput = CreateSystemInput["stages"][number];
const EQUIPMENT = [
  "filterRatingUm",
  "ultrasonicPowerW",
  "ultrasonicFrequencyKHz",
  "sprayPressureBar",
  "injectionPressureBar",
  "nozzleSet",
] as const;

/** A stage as typed, with each equipment field left out taken from the stored stage (or empty for a new one). */
export function completeStage(
  s: StageInput,
  stored?: Partial<EquipmentStage>,
): StageInput & EquipmentStage {
  const out = { ...s } as Record<string, unknown>;
  for (const key of EQUIPMENT) if (out[key] === undefined) out[key] = stored?.[key] ?? null;
  return out as unknown as StageInput & EquipmentStage;
}
type StageFields = StageInput & EquipmentStage;

/** Refuses stages out of process order or a mode without what defines it, naming the stage. */
export function assertStages(stages: StageFields[]) {
  const problems = stageProblems(stages);
  if (!problems.length) return;
  // Every problem beside its own field at once, so one save shows all that needs fixing.
  const fieldErrors: Record<string, string[]> = {};
  for (const p of problems) (fieldErrors[`stages.${p.index}.${p.field}`] ??= []).push(p.message);
  throw new UserFacingError(problems[0].message, {
    kind: "invalid",
    field: `stages.${problems[0].index}.${problems[0].field}`,
    fieldErrors,
  });
}

/** The audit trail's words for a stage: everything that defines the equipment. */
export function stageSummary(s: EquipmentStage) {
  const parts = [s.kind, s.capabilities.join(", ")];
  if (s.tankVolumeL) parts.push(`${s.tankVolumeL} L`);
  if (s.filterRatingUm) parts.push(`filter ${s.filterRatingUm} µm`);
  if (s.ultrasonicPowerW)
    parts.push(`ultrasonic ${s.ultrasonicPowerW} W at ${s.ultrasonicFrequencyKHz} kHz`);
  if (s.sprayPressureBar) parts.push(`spray ${s.sprayPressureBar} bar`);
  if (s.injectionPressureBar) parts.push(`injection ${s.injectionPressureBar} bar`);
  if (s.nozzleSet) parts.push(`nozzles ${s.nozzleSet}`);
  return `${s.name} (${parts.join("; ")})`;
}

export const stageValues = (s: StageFields, systemId: string, position: number) => ({
  systemId,
  position,
  name: s.name,
  kind: s.kind,
  capabilities: s.capabilities,
  tankVolumeL: s.tankVolumeL,
  filterRatingUm: s.filterRatingUm,
  ultrasonicPowerW: s.ultrasonicPowerW,
  ultrasonicFrequencyKHz: s.ultrasonicFrequencyKHz,
  sprayPressureBar: s.sprayPressureBar,
  injectionPressureBar: s.injectionPressureBar,
  nozzleSet: s.nozzleSet,
});

export async function createSystemIn(
  tx: Tx,
  actor: AuditActor,
  siteId: string,
  typed: CreateSystemInput,
) {
  const input = { ...typed, stages: typed.stages.map((s) => completeStage(s)) };
  assertStages(input.stages);
  const clashes = await tx
    .select({ code: cleaningSystems.code, assetNumber: cleaningSystems.assetNumber })
    .from(cleaningSystems)
    .where(
      input.assetNumber
        ? or(
            eq(cleaningSystems.code, input.code),
            eq(cleaningSystems.assetNumber, input.assetNumber),
          )
        : eq(cleaningSystems.code, input.code),
    );
  for (const c of clashes) {
    if (c.code === input.code)
      throw new UserFacingError(
        `A cleaning system with the code ${input.code} already exists.`,
        "code",
      );
    throw new UserFacingError(
      `Asset number ${input.assetNumber} is already system ${c.code}'s.`,
      "assetNumber",
    );
  }
  const [system] = await tx
    .insert(cleaningSystems)
    .values({
      siteId,
      code: input.code,
      assetNumber: input.assetNumber,
      name: input.name,
      kind: input.kind,
      description: input.description,
    })
    .returning();
  await tx
    .insert(systemStages)
    .values(input.stages.map((s, i) => stageValues(s, system.id, i + 1)));
  await appendAudit(tx, actor, {
    eventType: "cleaning_system.created",
    recordType: "cleaning_system",
    recordId: system.id,
    new: {
      code: input.code,
      assetNumber: input.assetNumber,
      name: input.name,
      kind: input.kind,
      description: input.description,
      stages: input.stages.map(stageSummary),
    },
  });
  return system;
}

/** A new cleaning system at a site, with its stages in process order. */
export async function createSystem(
  actor: AuditActor,
  input: CreateSystemInput & { siteId: string },
) {
  return getDb().transaction(async (tx) => {
    const [site] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, input.siteId));
    if (!site)
      throw new UserFacingError("That site does not exist. Reload the page.", {
        kind: "invalid",
        field: "siteId",
      });
    return createSystemIn(tx, actor, input.siteId, input);
  });
}
