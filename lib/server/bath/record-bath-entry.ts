// Not "server-only": the demo seed calls `recordBathEntryIn` under tsx.
import { eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { bathRecords, detergents, evidenceFiles, systemStages } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { evaluateReadingValues } from "@/lib/bath/limits";
import { concentrationFromTitration } from "@/lib/bath/titration";
import type { BathRecordInput } from "@/lib/schemas/evidence";
import { UserFacingError } from "@/lib/server/errors";
import { flagBathReadingBeyondReject } from "./flag-bath-reading";
import { loadBathPlan, planByVariable } from "./plan";

/**
 * Records a bath change, top-up, filter change, equipment check or reading for a tank. A reading
 * is graded against the tank's measurement plan as it stands; beyond a reject limit it is flagged.
 */
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
  return getDb().transaction((tx) => recordBathEntryIn(tx, actor, input, performedAt));
}

/** The entry's writes inside the caller's transaction; `performedAt` is already checked. */
export async function recordBathEntryIn(
  tx: Tx,
  actor: { id: string; name: string },
  input: BathRecordInput,
  performedAt: Date,
) {
  const [stage] = await tx.select().from(systemStages).where(eq(systemStages.id, input.stageId));
  if (!stage) throw new UserFacingError("This tank does not exist.", { kind: "not_found" });
  const plan = planByVariable(await loadBathPlan(tx, stage.id));
  const { stageId, performedAt: _p, detergentId: chosenDetergent, ...values } = input;

  // A titration needs a factor: the detergent named, else the one the plan's concentration line cites.
  let detergent: { id: string; name: string; factorPctPerMl: number } | null = null;
  const detergentId = chosenDetergent ?? plan.concentrationPct?.detergent?.id;
  if (detergentId) {
    const [d] = await tx.select().from(detergents).where(eq(detergents.id, detergentId));
    if (!d)
      throw new UserFacingError("Choose the detergent from the list.", {
        kind: "invalid",
        field: "detergentId",
      });
    detergent = d;
  }
  let concentrationPct = values.concentrationPct;
  if (values.titrantVolumeMl !== undefined) {
    if (!detergent)
      throw new UserFacingError(
        "Choose the detergent titrated: its factor turns the titrant volume into a concentration.",
        { kind: "invalid", field: "detergentId" },
      );
    try {
      concentrationPct = concentrationFromTitration({
        titrantVolumeMl: values.titrantVolumeMl,
        factorPctPerMl: detergent.factorPctPerMl,
      });
    } catch (error) {
      if (error instanceof RangeError)
        throw new UserFacingError(error.message, { kind: "invalid", field: "titrantVolumeMl" });
      throw error;
    }
  }
  if (values.photoFileId) {
    const [file] = await tx
      .select({ id: evidenceFiles.id })
      .from(evidenceFiles)
      .where(eq(evidenceFiles.id, values.photoFileId));
    if (!file)
      throw new UserFacingError("Upload the photo again.", {
        kind: "invalid",
        field: "photoFileId",
      });
  }
  const measured = {
    concentrationPct: concentrationPct ?? null,
    ph: values.ph ?? null,
    temperatureC: values.temperatureC ?? null,
    conductivityUsPerCm: values.conductivityUsPerCm ?? null,
    oilContentGPerL: values.oilContentGPerL ?? null,
  };
  const graded = Object.values(measured).some((v) => v !== null) && Object.keys(plan).length > 0;
  const evaluation = graded ? evaluateReadingValues(measured, plan) : null;
  const stored = {
    ...values,
    concentrationPct: concentrationPct,
    detergentId:
      values.titrantVolumeMl !== undefined || values.kind === "addition"
        ? (detergent?.id ?? null)
        : null,
    titrationFactor: values.titrantVolumeMl !== undefined ? detergent!.factorPctPerMl : null,
    limitState: evaluation?.state ?? null,
    limitFindings:
      evaluation && evaluation.findings.length > 0 ? evaluation.findings.join("; ") : null,
  };
  const [row] = await tx
    .insert(bathRecords)
    .values({ stageId, ...stored, performedAt: performedAt.toISOString(), recordedBy: actor.id })
    .returning();
  await appendAudit(tx, actor, {
    eventType: "bath_record.created",
    recordType: "bath_record",
    recordId: row.id,
    new: {
      tank: stage.name,
      ...values,
      concentrationPct,
      detergent: stored.detergentId ? detergent!.name : null,
      titrationFactor: stored.titrationFactor,
      limitState: stored.limitState,
      performedAt: row.performedAt,
    },
  });
  if (evaluation?.state === "reject")
    await flagBathReadingBeyondReject(tx, actor, {
      id: row.id,
      stageId: stage.id,
      tank: stage.name,
      performedAt: row.performedAt,
      state: evaluation.state,
      findings: evaluation.findings,
    });
  return { ...row, evaluation };
}
