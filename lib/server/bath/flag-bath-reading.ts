// Not "server-only": the demo seed reaches it through recordBathEntryIn under tsx.
import { eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { bathLimits, cleaningSystems, recipeVersions, systemStages } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { LimitState } from "@/lib/bath/limits";
import { formatDate } from "@/lib/format/date";
import { raiseNonconformance } from "@/lib/server/nonconformances/raise";
import { openNcForSource } from "@/lib/server/nonconformances/shared";

/**
 * A bath reading beyond its reject limit raises a flagged item: the reading keeps its state and
 * findings (the queue lists it until a later reading is back within limits), the flag is audited
 * and its nonconformance opened here, in the reading's transaction, so the failure has an owner.
 */
export async function flagBathReadingBeyondReject(
  tx: Tx,
  actor: { id: string; name: string },
  record: {
    id: string;
    stageId: string;
    tank: string;
    /** ISO time of the reading: the nonconformance's detection date. */
    performedAt: string;
    state: LimitState;
    findings: string[];
  },
) {
  await appendAudit(tx, actor, {
    eventType: "bath_record.flagged",
    recordType: "bath_record",
    recordId: record.id,
    new: { tank: record.tank, state: record.state, findings: record.findings },
  });
  if (await openNcForSource(tx, "bath_reading", record.id)) return;
  const when = formatDate(record.performedAt);
  // Named as the tank page is titled: tank names repeat from washer to washer.
  const [washer] = await tx
    .select({ code: cleaningSystems.code })
    .from(systemStages)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
    .where(eq(systemStages.id, record.stageId));
  const label = `${washer ? `${washer.code} · ` : ""}${record.tank} reading ${when}`;
  await raiseNonconformance(tx, {
    source: { kind: "bath_reading", id: record.id, label },
    title: `${label} beyond its reject limit`,
    description: record.findings.join("; "),
    severity: "major",
    detectedOn: when,
    recipeId: await tankRecipe(tx, record.stageId),
    partFamilyId: null,
    actorId: actor.id,
  });
}

/**
 * The recipe a tank's measurement plan was taken from, when its lines all cite one recipe; a tank
 * shared by several recipes names none rather than guess.
 */
async function tankRecipe(tx: Tx, stageId: string): Promise<string | null> {
  const rows = await tx
    .selectDistinct({ recipeId: recipeVersions.recipeId })
    .from(bathLimits)
    .innerJoin(recipeVersions, eq(recipeVersions.id, bathLimits.recipeVersionId))
    .where(eq(bathLimits.stageId, stageId));
  return rows.length === 1 ? rows[0].recipeId : null;
}
