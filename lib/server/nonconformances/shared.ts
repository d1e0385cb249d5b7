import { and, asc, eq, ne } from "drizzle-orm";
import type { Executor, Tx } from "@/db/client";
import {
  nonconformanceActions,
  nonconformanceItems,
  nonconformances,
  type Nonconformance,
} from "@/db/schema";
import { ncContentHash, type NcContent } from "@/lib/nonconformances/content";
import { NC_FINISHED, NC_STATUS_LABELS, type NcFacts } from "@/lib/nonconformances/lifecycle";
import { UserFacingError } from "@/lib/server/errors";

/** Reads one nonconformance inside the caller's transaction, or refuses plainly. */
export async function loadNc(tx: Executor, id: string): Promise<Nonconformance> {
  const [nc] = await tx.select().from(nonconformances).where(eq(nonconformances.id, id));
  if (!nc) throw new UserFacingError("This nonconformance does not exist.", { kind: "not_found" });
  return nc;
}

/** Refuses work on a closed or cancelled nonconformance. */
export function assertWorkable(nc: Nonconformance) {
  if (NC_FINISHED.includes(nc.status))
    throw new UserFacingError(
      `${nc.number} is ${NC_STATUS_LABELS[nc.status].toLowerCase()}; nothing more can be changed.`,
      { kind: "locked" },
    );
}

/** What the lifecycle rules need to know, read from the stored rows. */
export async function ncFacts(tx: Executor, nc: Nonconformance): Promise<NcFacts> {
  const items = await tx
    .select()
    .from(nonconformanceItems)
    .where(eq(nonconformanceItems.nonconformanceId, nc.id));
  const actions = await tx
    .select({ status: nonconformanceActions.status })
    .from(nonconformanceActions)
    .where(eq(nonconformanceActions.nonconformanceId, nc.id));
  return {
    undecidedItems: items.filter((i) => i.hold === "pending").length,
    heldWithoutDisposition: items.filter((i) => i.hold === "held" && !i.disposition).length,
    hasRootCause: nc.causeMethod !== null && nc.rootCause !== null,
    actions: actions.length,
    openActions: actions.filter((a) => a.status !== "done").length,
    hasEffectivenessPlan: !!nc.effectivenessCriterion && !!nc.effectivenessDueOn,
    effectiveness: nc.effectivenessResult,
    hasEffectivenessEvidence: !!nc.effectivenessRunId || !!nc.effectivenessFileId,
  };
}

/** The record as the closure signatures bind to it. */
export async function ncContent(tx: Executor, nc: Nonconformance): Promise<NcContent> {
  const items = await tx
    .select()
    .from(nonconformanceItems)
    .where(eq(nonconformanceItems.nonconformanceId, nc.id))
    .orderBy(asc(nonconformanceItems.processedAt), asc(nonconformanceItems.id));
  const actions = await tx
    .select()
    .from(nonconformanceActions)
    .where(eq(nonconformanceActions.nonconformanceId, nc.id))
    .orderBy(asc(nonconformanceActions.createdAt), asc(nonconformanceActions.id));
  return {
    number: nc.number,
    title: nc.title,
    description: nc.description,
    severity: nc.severity,
    source: {
      kind: nc.sourceKind,
      id: nc.sourceId,
      label: nc.sourceLabel,
      manualKind: nc.manualKind,
    },
    detectedOn: nc.detectedOn,
    causeMethod: nc.causeMethod,
    rootCause: nc.rootCause ?? null,
    items: items.map((i) => ({
      id: i.id,
      hold: i.hold,
      disposition: i.disposition,
      reference: i.concessionReference ?? i.recleanRecipeId,
    })),
    actions: actions.map((a) => ({
      id: a.id,
      kind: a.kind,
      description: a.description,
      status: a.status,
      evidence: a.evidenceLink,
    })),
    effectiveness: {
      criterion: nc.effectivenessCriterion,
      result: nc.effectivenessResult,
      runId: nc.effectivenessRunId,
      fileId: nc.effectivenessFileId,
    },
  };
}

export async function ncHash(tx: Executor, nc: Nonconformance) {
  return ncContentHash(await ncContent(tx, nc));
}

/** Open (not finished) nonconformances other than `exceptId` raised from the same source. */
export async function openNcForSource(
  tx: Tx,
  kind: Nonconformance["sourceKind"],
  sourceId: string,
) {
  const [row] = await tx
    .select({ id: nonconformances.id, number: nonconformances.number })
    .from(nonconformances)
    .where(
      and(
        eq(nonconformances.sourceKind, kind),
        eq(nonconformances.sourceId, sourceId),
        ne(nonconformances.status, "cancelled"),
      ),
    );
  return row ?? null;
}
